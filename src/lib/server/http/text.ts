/**
 * What the edge refuses in text sent to us: control characters, which no person types into a
 * field and which either break storage (PostgreSQL refuses NUL) or travel on into mail headers
 * and logs; lone UTF-16 surrogates, which no database stores as UTF-8; and field names that
 * reach into a JavaScript object's prototype.
 */

/** C0 controls apart from tab, line feed and carriage return; DEL; the C1 controls. */
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;
/** Tab, line feed and carriage return: fine in a text area, never in a one-line field. */
const LINE_BREAK_OR_TAB = /[\t\n\r]/;
/** Half of a surrogate pair without its other half (only JSON's `\ud800` escape can send one). */
const LONE_SURROGATE = /\p{Cs}/u;

/**
 * Fields that are text areas, where line breaks and tabs belong: abc notation, a lick's note,
 * a comment, a deck's description, the hand-written versions of a lick. A nested JSON value
 * counts as its top-level field (`versions.m7` is part of `versions`). Every other field is one
 * line. A new multi-line field is added here, in the one place the edge reads.
 */
export const MULTILINE_FIELDS: ReadonlySet<string> = new Set([
	'abc',
	'note',
	'notes',
	'text',
	'description',
	'comment',
	'message',
	'body',
	'versions'
]);

/** Names that would reach a JavaScript object's prototype if code ever copied fields by name. */
const RESERVED_NAMES: ReadonlySet<string> = new Set(['__proto__', 'constructor', 'prototype']);

/** Why a text field was refused: the field's path and a sentence for the person who sent it. */
export interface TextFault {
	field: string;
	message: string;
}

function codePoint(char: string): string {
	return `U+${char.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;
}

/**
 * The first thing wrong with one text value, as a sentence, or null when it is fine.
 * @example describeTextFault('a\u0000b', 'email', false) // 'The field “email” holds a control character (U+0000); remove it and send again.'
 */
export function describeTextFault(value: string, field: string, multiline: boolean): string | null {
	const control = CONTROL.exec(value);
	if (control) {
		return `The field “${field}” holds a control character (${codePoint(control[0])}); remove it and send again.`;
	}
	if (!multiline) {
		const lineBreak = LINE_BREAK_OR_TAB.exec(value);
		if (lineBreak) {
			const what = lineBreak[0] === '\t' ? 'a tab' : 'a line break';
			return `The field “${field}” is one line of text: remove ${what} and send again.`;
		}
	}
	if (LONE_SURROGATE.test(value)) {
		return `The field “${field}” holds a broken character (half of a surrogate pair); send the text again.`;
	}
	return null;
}

function describeNameFault(name: string, path: string): string | null {
	if (RESERVED_NAMES.has(name)) {
		return `A field may not be named “${name}”.`;
	}
	return describeTextFault(name, path || name, false);
}

/**
 * The first refused string or field name anywhere in a parsed JSON body, walked without
 * recursion so that deeply nested input cannot overflow the stack.
 * @example findJsonTextFault({ email: 'a\u0000@b.test' }) // { field: 'email', message: '…' }
 */
export function findJsonTextFault(body: unknown): TextFault | null {
	const stack: { value: unknown; path: string; top: string }[] = [
		{ value: body, path: '', top: '' }
	];
	while (stack.length > 0) {
		const { value, path, top } = stack.pop()!;
		if (typeof value === 'string') {
			const field = path || 'body';
			const message = describeTextFault(value, field, MULTILINE_FIELDS.has(top));
			if (message) return { field, message };
		} else if (Array.isArray(value)) {
			value.forEach((item, index) => stack.push({ value: item, path: `${path}[${index}]`, top }));
		} else if (value && typeof value === 'object') {
			for (const key of Object.keys(value)) {
				const childPath = path ? `${path}.${key}` : key;
				const message = describeNameFault(key, childPath);
				if (message) return { field: childPath, message };
				stack.push({
					value: (value as Record<string, unknown>)[key],
					path: childPath,
					top: top || key
				});
			}
		}
	}
	return null;
}

/**
 * The first refused text field (name or value) of a submitted form; files are not text and
 * are left to the route that reads them.
 * @example findFormTextFault(new URLSearchParams('email=a%00b')) // { field: 'email', message: '…' }
 */
export function findFormTextFault(form: Iterable<[string, FormDataEntryValue]>): TextFault | null {
	for (const [name, value] of form) {
		const nameFault = describeNameFault(name, name);
		if (nameFault) return { field: name, message: nameFault };
		if (typeof value !== 'string') continue;
		const message = describeTextFault(value, name, MULTILINE_FIELDS.has(name));
		if (message) return { field: name, message };
	}
	return null;
}

/**
 * A sentence when the address itself (path or query) holds a control character, else null:
 * every later reader (routes, the database, logs) then sees clean text.
 * @example findUrlFault(new URL('http://x.test/a?token=%00')) // 'The address holds a control character …'
 */
export function findUrlFault(url: URL): string | null {
	let path: string;
	try {
		path = decodeURIComponent(url.pathname);
	} catch {
		return 'The address is not valid: a percent sign must start an escape such as %20.';
	}
	const parts = [path];
	for (const [key, value] of url.searchParams) parts.push(key, value);
	for (const part of parts) {
		const found = CONTROL.exec(part) ?? LINE_BREAK_OR_TAB.exec(part);
		if (found) {
			return `The address holds a control character (${codePoint(found[0])}); check the link and try again.`;
		}
	}
	return null;
}
