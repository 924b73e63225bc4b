import { randomBytes } from 'node:crypto';

/**
 * Names of stored messages: a UTC timestamp to the millisecond, then a random suffix, e.g.
 * `20261201T215845123Z-3fa9c1`. Names sort in arrival order as plain strings, and the strict
 * pattern doubles as the guard against path traversal when an id comes from a URL.
 */

const idPattern = /^\d{8}T\d{9}Z-[0-9a-f]{6}$/;

/**
 * Whether a string is a well-formed outbox message id (and therefore safe as a file name).
 * @example isMessageId('20261201T215845123Z-3fa9c1') // true; isMessageId('../x') // false
 */
export function isMessageId(value: unknown): value is string {
	return typeof value === 'string' && idPattern.test(value);
}

function stamp(ms: number): string {
	return new Date(ms).toISOString().replace(/[-:.]/g, '');
}

let lastMs = 0;

/**
 * A fresh id for a message arriving at `nowMs`. Two messages within one millisecond get
 * consecutive milliseconds, so the order of names always matches the order of arrival.
 * @example createMessageId(Date.UTC(2026, 11, 1, 21, 58, 45, 123)) // '20261201T215845123Z-…'
 */
export function createMessageId(nowMs: number): string {
	lastMs = Math.max(nowMs, lastMs + 1);
	return `${stamp(lastMs)}-${randomBytes(3).toString('hex')}`;
}
