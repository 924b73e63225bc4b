import { describe, expect, it } from 'vitest';
import { breakDue, comesBackIn, noteNamesLine } from '../../../src/lib/drill/format';

const now = new Date('2026-03-01T19:00:00Z');
const after = (minutes: number) => new Date(now.getTime() + minutes * 60_000).toISOString();

describe('comesBackIn', () => {
	it.each([
		[after(0.2), 'now'],
		[after(1), 'in 1 min'],
		[after(10), 'in 10 min'],
		[after(59), 'in 59 min'],
		[after(60), 'in 1 h'],
		[after(60 * 19), 'in 19 h'],
		[after(60 * 24), 'tomorrow'],
		[after(60 * 24 * 3), 'in 3 days'],
		[after(60 * 24 * 61), 'in 2 mo'],
		[after(60 * 24 * 800), 'in 2 yr'],
		[undefined, ''],
		['garbage', '']
	])('says %j as %j', (due, words) => {
		expect(comesBackIn(due, now)).toBe(words);
	});
});

describe('breakDue', () => {
	it.each([
		[24, false],
		[25, true],
		[40, true]
	])('after %d minutes of playing a break is due: %s', (minutes, due) => {
		expect(breakDue(now, new Date(now.getTime() + minutes * 60_000))).toBe(due);
	});
});

describe('noteNamesLine', () => {
	it('says which key the names of a teaching note are in, and nothing when there is no news', () => {
		expect(noteNamesLine('moved', 'E♭')).toBe('Note names moved to E♭, the key of this prompt.');
		expect(noteNamesLine('some-moved', 'E♭')).toMatch(/moved to E♭; single letters stay/);
		expect(noteNamesLine('home', 'E♭')).toMatch(/lick's own key/);
		expect(noteNamesLine('none', 'E♭')).toBeNull();
	});
});
