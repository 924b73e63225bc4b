import { describe, expect, it } from 'vitest';
import { streakOf } from '../../../src/lib/practice/streak';

describe('streakOf', () => {
	it.each([
		[[], '2026-03-03', 0, 0],
		[['2026-03-01', '2026-03-02', '2026-03-03'], '2026-03-03', 3, 3],
		// Today still open: yesterday's run counts.
		[['2026-03-01', '2026-03-02'], '2026-03-03', 2, 2],
		// A missed day breaks it.
		[['2026-02-27', '2026-02-28', '2026-03-01', '2026-03-03'], '2026-03-03', 1, 3],
		[['2026-02-27', '2026-02-28'], '2026-03-03', 0, 2],
		// Month and leap-year boundaries; repeats and order do not matter.
		[['2028-03-01', '2028-02-29', '2028-02-28', '2028-02-29'], '2028-03-01', 3, 3],
		// Days after today (a clock ahead) are left out.
		[['2026-03-03', '2026-03-04'], '2026-03-03', 1, 1]
	] as const)('days %j on %s: current %i, longest %i', (days, today, current, longest) => {
		expect(streakOf(days, today)).toEqual({ current, longest });
	});
});
