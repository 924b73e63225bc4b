import { isInstrumentId } from '../music/instruments';

/**
 * A learner's practice settings: the type, the defaults, the limits a form may choose within, and
 * the reading of loose input. Pure, so the settings form and the server import the same rules.
 * Storage is the server's (`$lib/server/study/settings.ts`): the settings it queries are columns
 * on `users`, the rest one JSON column; every reader goes through `normalizeSettings`, so a field
 * added later needs no migration for the JSON part (old rows get its default).
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
	/** Local hour (0–23) at which the learner's practice day starts (`practiceDay` in `day.ts`). */
	dayStartHour: number;
	/** New licks a day introduced from the learner's own decks (classes set their own pace). */
	newPerDay: number;
}

export type KeyOrder = UserSettings['keyOrder'];
export const KEY_ORDERS = ['weighted', 'fourths'] as const satisfies readonly KeyOrder[];

export const DEFAULT_SETTINGS: Readonly<UserSettings> = Object.freeze({
	timezone: 'UTC',
	instrument: 'concert',
	digestHour: 7,
	digestEnabled: true,
	// ts-fsrs' own default request_retention.
	desiredRetention: 0.9,
	dailyMinutes: 15,
	keyOrder: 'weighted',
	// A sitting after midnight still counts for the evening before (common practice).
	dayStartHour: 4,
	newPerDay: 5
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
	if (Number.isInteger(value.dayStartHour)) {
		const h = value.dayStartHour as number;
		if (h >= 0 && h <= 23) out.dayStartHour = h;
	}
	if (Number.isInteger(value.newPerDay)) {
		const n = value.newPerDay as number;
		if (n >= SETTINGS_LIMITS.newPerDay.min && n <= SETTINGS_LIMITS.newPerDay.max) {
			out.newPerDay = n;
		}
	}
	return out;
}

function safeParse(text: string): unknown {
	try {
		return JSON.parse(text);
	} catch {
		return null;
	}
}

/** Bounds of what a person may choose on the settings form (stricter than what loads). */
export const SETTINGS_LIMITS = Object.freeze({
	dailyMinutes: { min: 5, max: 120 },
	// ts-fsrs accepts any request_retention in (0, 1), but the ends are no use to a learner
	// (common practice in FSRS-based trainers): towards 1 the intervals shrink so fast that the
	// daily review load explodes; below about 0.7 so much is forgotten between reviews that they
	// become relearning rather than review.
	desiredRetention: { min: 0.7, max: 0.97 },
	digestHour: { min: 0, max: 23 },
	dayStartHour: { min: 0, max: 23 },
	newPerDay: { min: 1, max: 20 }
});

/** The loose form (or JSON) input: every field as sent, usually a string. */
export type SettingsInput = Partial<Record<keyof UserSettings, unknown>>;

export type SettingsInputResult =
	{ ok: true; settings: UserSettings } | { ok: false; field: keyof UserSettings; message: string };

const INTEGER_TEXT = /^\s*\d{1,4}\s*$/;
const DECIMAL_TEXT = /^\s*\d{0,2}(\.\d{1,6})?\s*$/;

/** A whole number from a form string (or a number), or null when it is none. */
function readInteger(value: unknown): number | null {
	if (typeof value === 'number') return Number.isInteger(value) ? value : null;
	if (typeof value !== 'string' || !INTEGER_TEXT.test(value)) return null;
	return Number(value);
}

function readDecimal(value: unknown): number | null {
	if (typeof value === 'number') return Number.isFinite(value) ? value : null;
	if (typeof value !== 'string' || !DECIMAL_TEXT.test(value)) return null;
	const text = value.trim();
	return text === '' || text === '.' ? null : Number(text);
}

// IANA names and the plain UTC alias; Intl also takes offsets such as '+01:00' on newer engines,
// which are not zones (they ignore summer time), so the shape is checked too.
const ZONE_SHAPE = /^(UTC|[A-Za-z][A-Za-z0-9_+-]*(\/[A-Za-z0-9_+-]+){0,2})$/;

/** The canonical spelling of an IANA zone ('europe/berlin' → 'Europe/Berlin'), or null. */
function readTimezone(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const zone = value.trim();
	if (zone.length === 0 || zone.length > 64 || !ZONE_SHAPE.test(zone)) return null;
	try {
		return new Intl.DateTimeFormat('en', { timeZone: zone }).resolvedOptions().timeZone;
	} catch {
		return null;
	}
}

/** A checkbox: absent or empty when unticked, 'on' (its default value) when ticked. */
function readCheckbox(value: unknown): boolean | null {
	if (value === undefined || value === '' || value === false || value === 'off') return false;
	if (value === 'on' || value === true) return true;
	return null;
}

/**
 * The settings a person submitted, all fields checked strictly; the first bad field comes back
 * with a sentence to show beside it. Unlike `normalizeSettings` nothing falls back silently:
 * a wrong value on a form must be said, not replaced.
 *
 * @example readSettingsInput({ instrument: 'alto-sax', timezone: 'Europe/Lisbon', digestHour: '18', digestEnabled: 'on', desiredRetention: '0.9', dailyMinutes: '20', keyOrder: 'fourths' })
 * // → { ok: true, settings: { instrument: 'alto-sax', digestHour: 18, digestEnabled: true, … } }
 */
export function readSettingsInput(input: unknown): SettingsInputResult {
	const form: SettingsInput =
		input && typeof input === 'object' && !Array.isArray(input) ? (input as SettingsInput) : {};
	const refuse = (field: keyof UserSettings, message: string) =>
		({ ok: false, field, message }) as const;
	const {
		dailyMinutes: minutes,
		desiredRetention: retention,
		digestHour: hour,
		newPerDay: fresh
	} = SETTINGS_LIMITS;

	const instrument = typeof form.instrument === 'string' ? form.instrument.trim() : '';
	if (!isInstrumentId(instrument)) {
		return refuse('instrument', 'Choose one of the instruments in the list.');
	}
	const dailyMinutes = readInteger(form.dailyMinutes);
	if (dailyMinutes === null || dailyMinutes < minutes.min || dailyMinutes > minutes.max) {
		return refuse(
			'dailyMinutes',
			`Enter a whole number of minutes from ${minutes.min} to ${minutes.max}.`
		);
	}
	if (form.keyOrder !== 'weighted' && form.keyOrder !== 'fourths') {
		return refuse('keyOrder', 'Choose how the keys are picked: weakest first or round the cycle.');
	}
	const desiredRetention = readDecimal(form.desiredRetention);
	if (
		desiredRetention === null ||
		desiredRetention < retention.min ||
		desiredRetention > retention.max
	) {
		return refuse(
			'desiredRetention',
			`Choose how much to remember: a share from ${retention.min.toFixed(2)} to ${retention.max.toFixed(2)}.`
		);
	}
	const timezone = readTimezone(form.timezone);
	if (!timezone) {
		return refuse(
			'timezone',
			'Enter a time zone by its region and city name, such as Europe/Berlin or America/Chicago.'
		);
	}
	const digestHour = readInteger(form.digestHour);
	if (digestHour === null || digestHour < hour.min || digestHour > hour.max) {
		return refuse('digestHour', 'Choose an hour of the day from 0 to 23.');
	}
	const digestEnabled = readCheckbox(form.digestEnabled);
	if (digestEnabled === null) {
		return refuse('digestEnabled', 'The daily reminder is either on or off.');
	}
	const dayStartHour = readInteger(form.dayStartHour);
	if (dayStartHour === null || dayStartHour < hour.min || dayStartHour > hour.max) {
		return refuse('dayStartHour', 'Choose the hour your practice day starts, from 0 to 23.');
	}
	const newPerDay = readInteger(form.newPerDay);
	if (newPerDay === null || newPerDay < fresh.min || newPerDay > fresh.max) {
		return refuse(
			'newPerDay',
			`Enter a whole number of new licks a day from ${fresh.min} to ${fresh.max}.`
		);
	}
	return {
		ok: true,
		settings: {
			timezone,
			instrument,
			digestHour,
			digestEnabled,
			desiredRetention,
			dailyMinutes,
			keyOrder: form.keyOrder,
			dayStartHour,
			newPerDay
		}
	};
}
