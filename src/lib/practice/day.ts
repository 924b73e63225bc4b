/**
 * The practice day: a learner's day starts at a settable local hour (default 4 a.m.), so a
 * sitting after midnight belongs to the evening before. Pure: the instant and the zone are passed
 * in. Days are 'YYYY-MM-DD' strings, comparable as text.
 */

/** Local wall-clock parts of an instant in an IANA zone. */
interface WallClock {
	year: number;
	month: number;
	day: number;
	hour: number;
	minute: number;
	second: number;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
	let f = formatters.get(timeZone);
	if (!f) {
		f = new Intl.DateTimeFormat('en-US', {
			timeZone,
			hourCycle: 'h23',
			year: 'numeric',
			month: '2-digit',
			day: '2-digit',
			hour: '2-digit',
			minute: '2-digit',
			second: '2-digit'
		});
		formatters.set(timeZone, f);
	}
	return f;
}

/**
 * The wall clock in `timeZone` at `instant`.
 * @example wallClock(new Date('2026-01-01T00:30:00Z'), 'Pacific/Honolulu').hour // 14
 */
export function wallClock(instant: Date, timeZone: string): WallClock {
	const parts: Record<string, number> = {};
	for (const p of formatterFor(timeZone).formatToParts(instant)) {
		if (p.type !== 'literal') parts[p.type] = Number(p.value);
	}
	return {
		year: parts.year,
		month: parts.month,
		day: parts.day,
		hour: parts.hour,
		minute: parts.minute,
		second: parts.second
	};
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');

/** 'YYYY-MM-DD' of a calendar date given as UTC midnight milliseconds. */
function formatDay(utcMidnight: number): string {
	const d = new Date(utcMidnight);
	return `${pad(d.getUTCFullYear(), 4)}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}`;
}

/**
 * The practice day an instant belongs to for a learner in `timeZone` whose day starts at
 * `dayStartHour` local time.
 * @example practiceDay(new Date('2026-03-02T01:30:00Z'), 'UTC', 4) // '2026-03-01'
 */
export function practiceDay(instant: Date, timeZone: string, dayStartHour = 4): string {
	const w = wallClock(instant, timeZone);
	const midnight = Date.UTC(w.year, w.month - 1, w.day);
	return formatDay(w.hour < dayStartHour ? midnight - 86_400_000 : midnight);
}

/**
 * The day `offset` days after `day` ('YYYY-MM-DD'); negative goes back.
 * @example addDays('2026-02-28', 1) // '2026-03-01'
 */
export function addDays(day: string, offset: number): string {
	const [y, m, d] = day.split('-').map(Number);
	return formatDay(Date.UTC(y, m - 1, d) + offset * 86_400_000);
}

/** Whole days from `from` to `to` (both 'YYYY-MM-DD'). @example daysBetween('2026-01-30', '2026-02-02') // 3 */
export function daysBetween(from: string, to: string): number {
	const ms = (day: string) => {
		const [y, m, d] = day.split('-').map(Number);
		return Date.UTC(y, m - 1, d);
	};
	return Math.round((ms(to) - ms(from)) / 86_400_000);
}

/**
 * The instant a practice day starts: `day` at `dayStartHour` on the local wall clock. Where that
 * wall time does not exist (a spring-forward gap), the first instant after the gap.
 * @example dayStart('2026-03-01', 'UTC', 4).toISOString() // '2026-03-01T04:00:00.000Z'
 */
export function dayStart(day: string, timeZone: string, dayStartHour = 4): Date {
	const [y, m, d] = day.split('-').map(Number);
	const wanted = Date.UTC(y, m - 1, d, dayStartHour);
	// Offsets change at most twice a year: two corrections find the instant whose wall clock
	// reads `wanted`, or the one just after a gap.
	let guess = wanted;
	for (let i = 0; i < 3; i++) {
		const w = wallClock(new Date(guess), timeZone);
		const seen = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
		if (seen === wanted) break;
		guess += wanted - seen;
	}
	return new Date(guess);
}

/**
 * The half-open span [start, end) of instants belonging to a practice day.
 * @example dayBounds('2026-03-01', 'UTC', 4).end.toISOString() // '2026-03-02T04:00:00.000Z'
 */
export function dayBounds(
	day: string,
	timeZone: string,
	dayStartHour = 4
): { start: Date; end: Date } {
	return {
		start: dayStart(day, timeZone, dayStartHour),
		end: dayStart(addDays(day, 1), timeZone, dayStartHour)
	};
}
