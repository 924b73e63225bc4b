/**
 * A learner's preferences, stored as one JSON column on the user. Every reader goes through
 * `normalizeSettings`, so adding a field later needs no migration: old rows get its default.
 */
export interface UserSettings {
	/** IANA time zone; the digest goes out at `digestHour` local time there. */
	timezone: string;
	/** Instrument id the notation is written for; `concert` is untransposed treble clef. */
	instrument: string;
	/** Local hour (0–23) of the daily digest mail. */
	digestHour: number;
	/** Whether the daily digest is sent at all. */
	digestEnabled: boolean;
	/** Target probability of recall for the scheduler (ts-fsrs `request_retention`). */
	desiredRetention: number;
	/** Daily practice budget in minutes; the queue stops filling once it is spent. */
	dailyMinutes: number;
	/** How prompt keys are chosen: weighted toward weak keys, or around the cycle of fourths. */
	keyOrder: 'weighted' | 'fourths';
}

export const DEFAULT_SETTINGS: Readonly<UserSettings> = Object.freeze({
	timezone: 'UTC',
	instrument: 'concert',
	digestHour: 7,
	digestEnabled: true,
	// ts-fsrs' own default request_retention.
	desiredRetention: 0.9,
	dailyMinutes: 15,
	keyOrder: 'weighted'
});

function isValidTimezone(zone: string): boolean {
	try {
		new Intl.DateTimeFormat('en', { timeZone: zone });
		return true;
	} catch {
		return false;
	}
}

/**
 * Defaults merged with whatever stored or sent values are valid; invalid fields fall back to the
 * default instead of failing, because a stored row must always load.
 *
 * @example normalizeSettings({ digestHour: 20, bogus: 1 }) // → { ...DEFAULT_SETTINGS, digestHour: 20 }
 */
export function normalizeSettings(raw: unknown): UserSettings {
	const value = (typeof raw === 'string' ? safeParse(raw) : raw) as Record<string, unknown> | null;
	const out: UserSettings = { ...DEFAULT_SETTINGS };
	if (!value || typeof value !== 'object' || Array.isArray(value)) return out;
	if (typeof value.timezone === 'string' && isValidTimezone(value.timezone)) {
		out.timezone = value.timezone;
	}
	if (typeof value.instrument === 'string' && /^[a-z0-9-]{1,40}$/.test(value.instrument)) {
		out.instrument = value.instrument;
	}
	if (Number.isInteger(value.digestHour) && (value.digestHour as number) >= 0) {
		if ((value.digestHour as number) <= 23) out.digestHour = value.digestHour as number;
	}
	if (typeof value.digestEnabled === 'boolean') out.digestEnabled = value.digestEnabled;
	// ts-fsrs accepts request_retention in (0, 1]; below 0.7 intervals grow absurdly long.
	if (typeof value.desiredRetention === 'number') {
		const r = value.desiredRetention;
		if (r >= 0.7 && r <= 0.99) out.desiredRetention = r;
	}
	if (Number.isInteger(value.dailyMinutes)) {
		const m = value.dailyMinutes as number;
		if (m >= 1 && m <= 240) out.dailyMinutes = m;
	}
	if (value.keyOrder === 'weighted' || value.keyOrder === 'fourths') out.keyOrder = value.keyOrder;
	return out;
}

function safeParse(text: string): unknown {
	try {
		return JSON.parse(text);
	} catch {
		return null;
	}
}
