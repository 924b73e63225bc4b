import { open, readFile, readdir } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject, type ParsedMail } from 'mailparser';
import { getConfig } from '../config';
import { isMessageId } from './message-id';

/**
 * Reading the local outbox: the `.eml` files the stand-in SMTP server stored. Ids come from
 * URLs, so every id is checked against the strict id pattern before it touches the disk.
 */

export interface OutboxSummary {
	/** The file name without `.eml`; sorts in arrival order. */
	id: string;
	from: string;
	to: string;
	subject: string;
	/** ISO 8601 from the sender's Date header, or the arrival time when the header is missing. */
	date: string;
	/** ISO 8601 arrival time at the stand-in, read from the id. */
	receivedAt: string;
}

export interface OutboxMessage extends OutboxSummary {
	html: string | null;
	text: string | null;
	headers: { name: string; value: string }[];
	/** Every http(s) link found in the text and HTML parts, in order, without repeats. */
	links: string[];
}

export type ReadMessageResult =
	| { ok: true; message: OutboxMessage }
	| { ok: false; reason: 'bad-id' | 'not-found'; error: string };

/** The outbox folder in force: `DATA_DIR/outbox`. */
export function outboxDir(): string {
	return path.join(getConfig().dataDir, 'outbox');
}

function formatAddress(value: AddressObject | AddressObject[] | undefined): string {
	if (!value) return '';
	return (Array.isArray(value) ? value : [value]).map((address) => address.text).join(', ');
}

function dateFromId(id: string): string {
	const m = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})(\d{3})Z/.exec(id);
	return m ? `${m[1]}-${m[2]}-${m[3]}T${m[4]}:${m[5]}:${m[6]}.${m[7]}Z` : '';
}

function summarise(id: string, mail: ParsedMail): OutboxSummary {
	const receivedAt = dateFromId(id);
	return {
		id,
		from: formatAddress(mail.from),
		to: formatAddress(mail.to),
		subject: mail.subject ?? '',
		date: mail.date && !Number.isNaN(mail.date.getTime()) ? mail.date.toISOString() : receivedAt,
		receivedAt
	};
}

async function messageIds(dir: string): Promise<string[]> {
	let names: string[];
	try {
		names = await readdir(dir);
	} catch (error) {
		// No outbox yet simply means no mail yet.
		if ((error as NodeJS.ErrnoException).code === 'ENOENT') return [];
		throw error;
	}
	return names
		.filter((name) => name.endsWith('.eml'))
		.map((name) => name.slice(0, -4))
		.filter(isMessageId);
}

const headerReadBytes = 64 * 1024;

/**
 * The header block of a stored message: the list needs nothing below the first empty line,
 * and a header block beyond 64 KiB is cut there rather than read whole.
 */
async function readHeaderBlock(file: string): Promise<Buffer> {
	const handle = await open(file, 'r');
	try {
		const { buffer, bytesRead } = await handle.read(
			Buffer.alloc(headerReadBytes),
			0,
			headerReadBytes,
			0
		);
		const start = buffer.subarray(0, bytesRead);
		const crlf = start.indexOf('\r\n\r\n');
		if (crlf !== -1) return start.subarray(0, crlf + 4);
		const lf = start.indexOf('\n\n');
		return lf !== -1 ? start.subarray(0, lf + 2) : start;
	} finally {
		await handle.close();
	}
}

/**
 * The number of stored messages.
 * @example await countMessages() // 3
 */
export async function countMessages(dir = outboxDir()): Promise<number> {
	return (await messageIds(dir)).length;
}

/**
 * Stored messages, newest first, with the header fields a list shows.
 * @example (await listMessages())[0] // { id: '20261201T…', from: '…', to: 'ada@…', subject: '…', date: '2026-12-01T…' }
 */
export async function listMessages(
	options: { dir?: string; limit?: number } = {}
): Promise<OutboxSummary[]> {
	const { dir = outboxDir(), limit = 200 } = options;
	const ids = (await messageIds(dir)).sort().reverse().slice(0, limit);
	const summaries = await Promise.all(
		ids.map(async (id) => {
			try {
				const header = await readHeaderBlock(path.join(dir, `${id}.eml`));
				return summarise(id, await simpleParser(header));
			} catch (error) {
				// Removed between listing the folder and opening the file: no longer in the outbox.
				if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
				throw error;
			}
		})
	);
	return summaries.filter((summary) => summary !== null);
}

const linkPattern = /https?:\/\/[^\s<>"'()]+/g;
const hrefPattern = /href\s*=\s*"(https?:\/\/[^"]+)"/gi;

function decodeAttribute(value: string): string {
	return value
		.replace(/&quot;/g, '"')
		.replace(/&#39;/g, "'")
		.replace(/&lt;/g, '<')
		.replace(/&gt;/g, '>')
		.replace(/&amp;/g, '&');
}

/**
 * The http(s) links of a message, text part first; trailing sentence punctuation is dropped.
 * @example findLinks('Open https://x.test/a.', null) // ['https://x.test/a']
 */
export function findLinks(text: string | null, html: string | null): string[] {
	const fromText = (text ?? '').match(linkPattern) ?? [];
	const fromHtml = [...(html ?? '').matchAll(hrefPattern)].map((m) => decodeAttribute(m[1]));
	const cleaned = [...fromText, ...fromHtml].map((link) => link.replace(/[.,;:!?]+$/, ''));
	return [...new Set(cleaned)];
}

function headerValue(value: unknown): string {
	if (typeof value === 'string') return value;
	if (Array.isArray(value)) return value.map(headerValue).join(', ');
	if (value instanceof Date) return value.toISOString();
	if (value && typeof value === 'object' && 'text' in value) return String(value.text);
	if (value && typeof value === 'object' && 'value' in value) {
		const { value: main, params } = value as { value: string; params?: Record<string, string> };
		const extra = Object.entries(params ?? {}).map(([k, v]) => `; ${k}=${v}`);
		return main + extra.join('');
	}
	return JSON.stringify(value);
}

/**
 * One row per header line, spelled as in the message and in its order. The value is
 * mailparser's decoded one where it has it (encoded words, addresses), else the raw line
 * unfolded: mailparser files List-* headers under one structured `list` key, for example.
 */
function headerRows(mail: ParsedMail): { name: string; value: string }[] {
	const seen = new Map<string, number>();
	return mail.headerLines.map(({ key, line }) => {
		const colon = line.indexOf(':');
		const raw = line
			.slice(colon + 1)
			.replace(/\r?\n[ \t]+/g, ' ')
			.trim();
		const decoded = mail.headers.get(key);
		const nth = seen.get(key) ?? 0;
		seen.set(key, nth + 1);
		// A repeated header (Received) has an array of values: take the matching one.
		const value = Array.isArray(decoded) ? decoded[nth] : decoded;
		return {
			name: line.slice(0, colon).trim(),
			value: value === undefined ? raw : headerValue(value)
		};
	});
}

/**
 * One stored message with both parts and its headers, or why it cannot be read.
 * @example await readMessage('../etc/passwd') // { ok: false, reason: 'bad-id', error: 'No message …' }
 */
export async function readMessage(id: unknown, dir = outboxDir()): Promise<ReadMessageResult> {
	if (!isMessageId(id)) {
		const shown = typeof id === 'string' ? JSON.stringify(id.slice(0, 80)) : 'without an id';
		return {
			ok: false,
			reason: 'bad-id',
			error: `No message ${shown} in the outbox: ids look like 20261201T215845123Z-3fa9c1`
		};
	}
	let raw: Buffer;
	try {
		raw = await readFile(path.join(dir, `${id}.eml`));
	} catch (error) {
		if ((error as NodeJS.ErrnoException).code === 'ENOENT') {
			return { ok: false, reason: 'not-found', error: `No message "${id}" in the outbox` };
		}
		throw error;
	}
	const mail = await simpleParser(raw);
	const html = typeof mail.html === 'string' ? mail.html : null;
	const text = mail.text ?? null;
	return {
		ok: true,
		message: {
			...summarise(id, mail),
			html,
			text,
			headers: headerRows(mail),
			links: findLinks(text, html)
		}
	};
}
