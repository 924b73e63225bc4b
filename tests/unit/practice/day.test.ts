import { describe, expect, it } from 'vitest';
import { addDays, dayBounds, daysBetween, practiceDay } from '../../../src/lib/practice/day';

// Zone offsets and summer-time dates from the IANA tz database as shipped with Node's ICU
// (Pacific/Honolulu UTC−10 all year; Pacific/Kiritimati UTC+14; Pacific/Tongatapu UTC+13;
// Europe/Berlin moves to summer time on the last Sunday of March, 2026-03-29 at 02:00).
describe('practiceDay', () => {
	it.each([
		// instant (UTC), zone, day-start hour, practice day
		['2026-03-02T01:30:00Z', 'UTC', 4, '2026-03-01'],
		['2026-03-02T04:00:00Z', 'UTC', 4, '2026-03-02'],
		['2026-03-02T03:59:59Z', 'UTC', 4, '2026-03-01'],
		['2026-03-02T00:00:00Z', 'UTC', 0, '2026-03-02'],
		// Honolulu (UTC−10): 13:59 UTC is 03:59 local, still the day before.
		['2026-03-02T13:59:00Z', 'Pacific/Honolulu', 4, '2026-03-01'],
		['2026-03-02T14:00:00Z', 'Pacific/Honolulu', 4, '2026-03-02'],
		// Tongatapu (UTC+13): 15:00 UTC on the 1st is 04:00 local on the 2nd.
		['2026-03-01T14:59:00Z', 'Pacific/Tongatapu', 4, '2026-03-01'],
		['2026-03-01T15:00:00Z', 'Pacific/Tongatapu', 4, '2026-03-02'],
		// Year boundary.
		['2027-01-01T02:00:00Z', 'UTC', 4, '2026-12-31']
	] as const)('puts %s in %s (day starts %i h) on %s', (instant, zone, hour, day) => {
		expect(practiceDay(new Date(instant), zone, hour)).toBe(day);
	});

	it('throws on a zone the tz database does not know', () => {
		expect(() => practiceDay(new Date(), 'Not/AZone', 4)).toThrow();
	});
});

describe('day arithmetic', () => {
	it.each([
		['2026-02-28', 1, '2026-03-01'],
		['2028-02-28', 1, '2028-02-29'],
		['2026-01-01', -1, '2025-12-31'],
		['2026-03-29', 0, '2026-03-29']
	] as const)('%s plus %i days is %s', (day, n, out) => {
		expect(addDays(day, n)).toBe(out);
		expect(daysBetween(day, out)).toBe(n);
	});
});

describe('dayBounds', () => {
	it('spans 24 hours on an ordinary day', () => {
		const { start, end } = dayBounds('2026-03-01', 'Pacific/Honolulu', 4);
		expect(start.toISOString()).toBe('2026-03-01T14:00:00.000Z');
		expect(end.toISOString()).toBe('2026-03-02T14:00:00.000Z');
	});

	it('spans 23 hours across the spring change in Berlin and 25 across the autumn one', () => {
		const spring = dayBounds('2026-03-28', 'Europe/Berlin', 4);
		expect(spring.start.toISOString()).toBe('2026-03-28T03:00:00.000Z');
		expect(spring.end.toISOString()).toBe('2026-03-29T02:00:00.000Z');
		const autumn = dayBounds('2026-10-24', 'Europe/Berlin', 4);
		expect((autumn.end.getTime() - autumn.start.getTime()) / 3_600_000).toBe(25);
	});

	it('agrees with practiceDay at both ends', () => {
		for (const zone of ['UTC', 'Pacific/Honolulu', 'Pacific/Tongatapu', 'Europe/Berlin']) {
			const { start, end } = dayBounds('2026-03-29', zone, 4);
			expect(practiceDay(start, zone, 4)).toBe('2026-03-29');
			expect(practiceDay(new Date(end.getTime() - 1), zone, 4)).toBe('2026-03-29');
			expect(practiceDay(end, zone, 4)).toBe('2026-03-30');
		}
	});
});
