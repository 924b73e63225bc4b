import { describe, expect, test } from 'vitest';
import { safeNext } from '../../../../src/lib/server/auth/redirects';

describe('safeNext decides on the URL a browser will follow, not on the text as typed', () => {
	// Each of these starts with one slash but normalises to `//evil.test` (or `//x`), which a
	// browser reads as another host.
	test.each([
		'/.//evil.test',
		'/..//x',
		'/%2e//x',
		'/%2E%2E//x',
		'/./\\x',
		'/.\\/evil.test',
		'/a/..//evil.test',
		'/\t/evil.test',
		'/\n/evil.test',
		'//evil.test',
		'/\\evil.test',
		'https://evil.test',
		'javascript:alert(1)'
	])('%j goes to the fallback', (next) => {
		expect(safeNext(next)).toBe('/home');
	});

	test.each([
		['/teach/decks?x=1#top', '/teach/decks?x=1#top'],
		['/a/../settings', '/settings'],
		['/%5C%5Cevil.test', '/%5C%5Cevil.test'],
		['/.%2F%2Fevil.test', '/.%2F%2Fevil.test']
	])('%j stays on this site as %j', (next, expected) => {
		expect(safeNext(next)).toBe(expected);
	});
});
