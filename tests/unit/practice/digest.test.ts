import { describe, expect, it } from 'vitest';
import {
	ENCOURAGEMENTS,
	encouragementFor,
	formatKey,
	isoWeekday,
	weakestKeys
} from '../../../src/lib/practice/digest';

describe('weakestKeys', () => {
	it.each([
		[
			'ranks by mean grade mapped to 0–1, weakest first',
			[
				{ key: 'Eb', reviews: 3, gradeSum: 5 },
				{ key: 'C', reviews: 2, gradeSum: 7 },
				{ key: 'A', reviews: 1, gradeSum: 1 }
			],
			[
				['A', 0],
				['Eb', 0.222],
				['C', 0.833]
			]
		],
		[
			// F# and Gb are one key (one pitch class); the spelling most reviews used names it.
			'counts enharmonic spellings as one key',
			[
				{ key: 'F#', reviews: 1, gradeSum: 2 },
				{ key: 'Gb', reviews: 2, gradeSum: 2 }
			],
			[['Gb', 0.111]]
		],
		[
			'leaves out keys played without a flaw and anything that is not a key',
			[
				{ key: 'D', reviews: 4, gradeSum: 16 },
				{ key: 'H', reviews: 4, gradeSum: 4 },
				{ key: 'E', reviews: 0, gradeSum: 0 }
			],
			[]
		]
	])('%s', (_title, tallies, expected) => {
		const got = weakestKeys(tallies).map((k) => [k.key, Math.round(k.strength * 1000) / 1000]);
		expect(got).toEqual(expected);
	});

	it('gives at most three, breaking ties by the number of prompts', () => {
		const tallies = ['C', 'D', 'E', 'F', 'G'].map((key, i) => ({
			key,
			reviews: i + 1,
			gradeSum: i + 1
		}));
		expect(weakestKeys(tallies).map((k) => k.key)).toEqual(['G', 'F', 'E']);
	});
});

describe('isoWeekday', () => {
	// Calendar facts (from memory): 2 March 2026 is a Monday, 1 January 2026 a Thursday,
	// 29 February 2028 a Tuesday.
	it.each([
		['2026-03-02', 1],
		['2026-03-08', 7],
		['2026-01-01', 4],
		['2028-02-29', 2],
		['2025-12-31', 3]
	])('%s is weekday %i', (day, weekday) => {
		expect(isoWeekday(day)).toBe(weekday);
	});
});

describe('encouragementFor', () => {
	it('is the same for a person and day, and varies across days', () => {
		expect(encouragementFor('u1', '2026-03-02')).toBe(encouragementFor('u1', '2026-03-02'));
		const week = Array.from({ length: 14 }, (_, i) =>
			encouragementFor('u1', `2026-03-${String(i + 1).padStart(2, '0')}`)
		);
		expect(new Set(week).size).toBeGreaterThan(3);
		expect(week.every((line) => ENCOURAGEMENTS.includes(line))).toBe(true);
	});
});

describe('formatKey', () => {
	it.each([
		['Eb', 'E♭'],
		['F#', 'F♯'],
		['C', 'C'],
		['Bb', 'B♭']
	])('%s reads %s', (key, shown) => {
		expect(formatKey(key)).toBe(shown);
	});
});
