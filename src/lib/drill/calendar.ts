/**
 * The streak calendar's grid: whole weeks (Monday first) ending with the week of `today`, each
 * day with its review count. Pure date arithmetic on 'YYYY-MM-DD' practice days (UTC noon, so no
 * zone or summer-time shift can move a day).
 */

export interface CalendarDay {
	day: string;
	reviews: number;
	/** After today: drawn empty. */
	future: boolean;
}

const DAY_MS = 86_400_000;

function toTime(day: string): number {
	const [y, m, d] = day.split('-').map(Number);
	return Date.UTC(y, m - 1, d, 12);
}

function toDay(time: number): string {
	return new Date(time).toISOString().slice(0, 10);
}

/**
 * Weeks of days, oldest first; each week is Monday to Sunday.
 * @example calendarWeeks('2026-03-04', [{ day: '2026-03-02', reviews: 5 }], 1) // [[Mon 2 → 5, Tue 3 → 0, Wed 4 → 0, Thu 5 (future)…]]
 */
export function calendarWeeks(
	today: string,
	counts: readonly { day: string; reviews: number }[],
	weeks: number
): CalendarDay[][] {
	const byDay = new Map(counts.map((c) => [c.day, c.reviews]));
	const end = toTime(today);
	// getUTCDay: 0 is Sunday; Monday-first offset of today within its week.
	const offset = (new Date(end).getUTCDay() + 6) % 7;
	const first = end - (offset + 7 * (weeks - 1)) * DAY_MS;
	const out: CalendarDay[][] = [];
	for (let w = 0; w < weeks; w++) {
		const week: CalendarDay[] = [];
		for (let d = 0; d < 7; d++) {
			const t = first + (w * 7 + d) * DAY_MS;
			const day = toDay(t);
			week.push({ day, reviews: byDay.get(day) ?? 0, future: t > end });
		}
		out.push(week);
	}
	return out;
}

/**
 * A short label for a practice day: day of the month, with the month on the first of it.
 * @example shortDay('2026-03-01') // 'Mar 1'
 */
export function shortDay(day: string): string {
	const date = new Date(toTime(day));
	const d = date.getUTCDate();
	const month = date.toLocaleString('en', { month: 'short', timeZone: 'UTC' });
	return d === 1 ? `${month} 1` : String(d);
}

/** @example weekdayOf('2026-03-02') // 'Mon' */
export function weekdayOf(day: string): string {
	return new Date(toTime(day)).toLocaleString('en', { weekday: 'short', timeZone: 'UTC' });
}
