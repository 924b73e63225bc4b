/**
 * Dates on the admin pages are shown in UTC, the same on the server and in the browser, so a
 * hydrated page never disagrees with the one the server sent.
 * @example formatUtc('2026-12-01T21:58:45.123Z') // '2026-12-01 21:58 UTC'
 */
export function formatUtc(iso: string): string {
	const date = new Date(iso);
	if (Number.isNaN(date.getTime())) return 'unknown date';
	return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/**
 * A duration in seconds as days, hours and minutes, the largest two units only.
 * @example formatUptime(93784) // '1 d 2 h'
 */
export function formatUptime(seconds: number): string {
	const days = Math.floor(seconds / 86400);
	const hours = Math.floor((seconds % 86400) / 3600);
	const minutes = Math.floor((seconds % 3600) / 60);
	if (days > 0) return `${days} d ${hours} h`;
	if (hours > 0) return `${hours} h ${minutes} min`;
	return minutes > 0 ? `${minutes} min` : `${Math.floor(seconds)} s`;
}
