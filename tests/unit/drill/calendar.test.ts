import { describe, expect, it } from 'vitest';
import { calendarWeeks, shortDay, weekdayOf } from '../../../src/lib/drill/calendar';

describe('calendarWeeks', () => {
	it('lays out whole Monday-first weeks ending with the week of today', () => {
		// 2026-03-04 is a Wednesday (any perpetual calendar; checked with Date.UTC).
		const weeks = calendarWeeks(
			'2026-03-04',
			[
				{ day: '2026-03-02', reviews: 5 },
				{ day: '2026-02-23', reviews: 2 }
			],
			2
		);
		expect(weeks.map((w) => w.map((d) => d.day))).toEqual([
			[
				'2026-02-23',
				'2026-02-24',
				'2026-02-25',
				'2026-02-26',
				'2026-02-27',
				'2026-02-28',
				'2026-03-01'
			],
			[
				'2026-03-02',
				'2026-03-03',
				'2026-03-04',
				'2026-03-05',
				'2026-03-06',
				'2026-03-07',
				'2026-03-08'
			]
		]);
		expect(weeks[0][0].reviews).toBe(2);
		expect(weeks[1].map((d) => [d.reviews, d.future])).toEqual([
			[5, false],
			[0, false],
			[0, false],
			[0, true],
			[0, true],
			[0, true],
			[0, true]
		]);
	});

	it('crosses a leap day and a year end', () => {
		const weeks = calendarWeeks('2029-01-01', [], 1);
		expect(weeks[0][0].day).toBe('2029-01-01');
		expect(
			calendarWeeks('2028-03-01', [], 1)[0]
				.map((d) => d.day)
				.slice(0, 3)
		).toEqual(['2028-02-28', '2028-02-29', '2028-03-01']);
	});
});

describe('shortDay and weekdayOf', () => {
	it.each([
		['2026-03-01', 'Mar 1', 'Sun'],
		['2026-03-17', '17', 'Tue']
	])('labels %s as %s on a %s', (day, label, weekday) => {
		expect(shortDay(day)).toBe(label);
		expect(weekdayOf(day)).toBe(weekday);
	});
});
