import { describe, expect, it } from 'vitest';
import { readRange } from '../../../../src/lib/server/library/recordings';

// RFC 9110 §14.1.2: byte ranges are inclusive; a suffix range counts from the end.
describe('readRange', () => {
	it.each([
		[null, 100, null],
		['bytes=0-9', 100, { start: 0, end: 9 }],
		['bytes=90-', 100, { start: 90, end: 99 }],
		['bytes=-10', 100, { start: 90, end: 99 }],
		['bytes=-500', 100, { start: 0, end: 99 }],
		['bytes=50-500', 100, { start: 50, end: 99 }],
		['bytes=100-', 100, 'unsatisfiable'],
		['bytes=9-3', 100, 'unsatisfiable'],
		['bytes=-0', 100, 'unsatisfiable'],
		// Several ranges or other units are answered with the whole file (allowed by §14.2).
		['bytes=0-1,5-6', 100, null],
		['items=0-1', 100, null],
		['bytes=-', 100, null]
	])('reads %j against %i bytes as %j', (header, size, out) => {
		expect(readRange(header, size)).toEqual(out);
	});
});
