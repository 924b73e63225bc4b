import { describe, expect, test } from 'vitest';
import {
	describeTextFault,
	findFormTextFault,
	findJsonTextFault,
	findUrlFault
} from '../../../../src/lib/server/http/text';

describe('control characters in text fields', () => {
	test.each([
		['\u0000', 'U+0000'],
		['\u0007', 'U+0007'],
		['\u001b', 'U+001B'],
		['\u007f', 'U+007F'],
		['\u0085', 'U+0085'],
		['\u009f', 'U+009F']
	])('%j is refused in any field, naming %s', (char, code) => {
		expect(describeTextFault(`a${char}b`, 'email', false)).toContain(code);
		expect(describeTextFault(`a${char}b`, 'abc', true)).toContain(code);
	});

	test('line breaks and tabs belong in text areas only', () => {
		expect(describeTextFault('X:1\nK:C\r\n\tC', 'abc', true)).toBeNull();
		expect(describeTextFault('Lou\nPardee', 'name', false)).toMatch(/one line.*line break/);
		expect(describeTextFault('Lou\tPardee', 'name', false)).toMatch(/tab/);
	});

	test('a lone surrogate is refused, a real pair is kept', () => {
		expect(describeTextFault('\ud800', 'name', false)).toMatch(/broken character/);
		expect(describeTextFault('🎷 Lou', 'name', false)).toBeNull();
	});

	test('plain text of any script passes', () => {
		expect(describeTextFault('Ines Kowal — Æsir ♭ 日本', 'name', false)).toBeNull();
	});
});

describe('walking a JSON body', () => {
	test.each([
		[{ email: 'a\u0000@b.test' }, 'email'],
		[{ versions: { m7: 'X:1\u0000' } }, 'versions.m7'],
		[{ list: ['ok', 'bad\u0001'] }, 'list[1]'],
		[JSON.parse('{"__proto__":{"role":"admin"}}'), '__proto__'],
		[{ constructor: 1 }, 'constructor'],
		[{ 'na\u0000me': 'x' }, 'na\u0000me'],
		['\u0000', 'body']
	])('%j is refused at %j', (body, field) => {
		expect(findJsonTextFault(body)?.field).toBe(field);
	});

	test('line breaks pass inside a multi-line field, nested too, and nowhere else', () => {
		expect(findJsonTextFault({ abc: 'X:1\nK:C', versions: { m7: 'X:1\nK:Cm' } })).toBeNull();
		expect(findJsonTextFault({ title: 'a\nb' })?.field).toBe('title');
	});

	test('a deeply nested body is walked without overflowing the stack', () => {
		const deep = JSON.parse('['.repeat(100_000) + '"\\u0000"' + ']'.repeat(100_000));
		expect(findJsonTextFault(deep)?.message).toContain('U+0000');
	});
});

describe('forms and addresses', () => {
	test('a form field or field name with a control character is refused', () => {
		expect(findFormTextFault(new URLSearchParams('email=a%00b'))?.field).toBe('email');
		expect(findFormTextFault(new URLSearchParams('__proto__=x'))?.message).toMatch(/named/);
		expect(findFormTextFault(new URLSearchParams('abc=X%3A1%0AK%3AC'))).toBeNull();
	});

	test('an address with a control character in its path or query is refused', () => {
		expect(findUrlFault(new URL('http://x.test/reset-password?token=%00'))).toContain('U+0000');
		expect(findUrlFault(new URL('http://x.test/admin/outbox/a%0Ab'))).toContain('U+000A');
		expect(findUrlFault(new URL('http://x.test/sign-in?next=%2Fhome'))).toBeNull();
	});
});
