import { z } from 'zod';
import { parseFirst } from '../forms/parse';
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

/**
 * Zones already checked. Building a formatter is the costly part of reading a signed-in user's
 * settings on every request, and the answer for a zone name never changes within a process; the
 * names kept are bounded by those stored (unknown ones are not kept).
 */
const knownZones = new Set<string>();

function isValidTimezone(zone: string): boolean {
	if (knownZones.has(zone)) return true;
	try {
		new Intl.DateTimeFormat('en', { timeZone: zone });
		knownZones.add(zone);
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

/** Messages of the settings form, one per field. */
const MESSAGES = {
	instrument: 'Choose one of the instruments in the list.',
	dailyMinutes: `Enter a whole number of minutes from ${SETTINGS_LIMITS.dailyMinutes.min} to ${SETTINGS_LIMITS.dailyMinutes.max}.`,
	keyOrder: 'Choose how the keys are picked: weakest first or round the cycle.',
	desiredRetention: `Choose how much to remember: a share from ${SETTINGS_LIMITS.desiredRetention.min.toFixed(2)} to ${SETTINGS_LIMITS.desiredRetention.max.toFixed(2)}.`,
	timezone:
		'Enter a time zone by its region and city name, such as Europe/Berlin or America/Chicago.',
	digestHour: 'Choose an hour of the day from 0 to 23.',
	digestEnabled: 'The daily reminder is either on or off.',
	dayStartHour: 'Choose the hour your practice day starts, from 0 to 23.',
	newPerDay: `Enter a whole number of new licks a day from ${SETTINGS_LIMITS.newPerDay.min} to ${SETTINGS_LIMITS.newPerDay.max}.`
} as const satisfies Record<keyof UserSettings, string>;

/** A whole number within limits, with one message for every way of missing them. */
const wholeNumber = (limits: { min: number; max: number }, message: string) =>
	z.number({ error: message }).int(message).min(limits.min, message).max(limits.max, message);

// IANA names and the plain UTC alias; Intl also takes offsets such as '+01:00' on newer engines,
// which are not zones (they ignore summer time), so the shape is checked too.
const ZONE_SHAPE = /^(UTC|[A-Za-z][A-Za-z0-9_+-]*(\/[A-Za-z0-9_+-]+){0,2})$/;

/**
 * The canonical spelling of an IANA zone, or null when it is none.
 * @example canonicalZone(' europe/berlin ') // → 'Europe/Berlin'
 */
export function canonicalZone(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const zone = value.trim();
	if (zone.length === 0 || zone.length > 64 || !ZONE_SHAPE.test(zone)) return null;
	try {
		return new Intl.DateTimeFormat('en', { timeZone: zone }).resolvedOptions().timeZone;
	} catch {
		return null;
	}
}

/**
 * The practice settings form: one schema for the page, its action and `readSettingsInput`.
 * Field order is the form's, so the first problem reported is the first one on screen.
 */
export const settingsSchema = z.object({
	instrument: z.string({ error: MESSAGES.instrument }).refine(isInstrumentId, MESSAGES.instrument),
	dailyMinutes: wholeNumber(SETTINGS_LIMITS.dailyMinutes, MESSAGES.dailyMinutes),
	keyOrder: z.enum(KEY_ORDERS, { error: MESSAGES.keyOrder }),
	desiredRetention: z
		.number({ error: MESSAGES.desiredRetention })
		.min(SETTINGS_LIMITS.desiredRetention.min, MESSAGES.desiredRetention)
		.max(SETTINGS_LIMITS.desiredRetention.max, MESSAGES.desiredRetention),
	timezone: z
		.string({ error: MESSAGES.timezone })
		.refine((zone) => canonicalZone(zone) !== null, MESSAGES.timezone),
	digestHour: wholeNumber(SETTINGS_LIMITS.digestHour, MESSAGES.digestHour),
	digestEnabled: z.boolean({ error: MESSAGES.digestEnabled }),
	dayStartHour: wholeNumber(SETTINGS_LIMITS.dayStartHour, MESSAGES.dayStartHour),
	newPerDay: wholeNumber(SETTINGS_LIMITS.newPerDay, MESSAGES.newPerDay)
}) satisfies z.ZodType<UserSettings>;

/**
 * The Weekly class summary, a teacher's mail: whether it comes, and on which day of the week (ISO
 * weekday, 1 Monday … 7 Sunday). Columns of their own on `users`, saved apart from the practice
 * settings because only teachers have it.
 */
export type SummaryChoice = {
	summaryEnabled: boolean;
	summaryWeekday: number;
};

export const WEEKDAYS = [
	'Monday',
	'Tuesday',
	'Wednesday',
	'Thursday',
	'Friday',
	'Saturday',
	'Sunday'
] as const;

export const DEFAULT_SUMMARY_CHOICE: Readonly<SummaryChoice> = Object.freeze({
	summaryEnabled: true,
	summaryWeekday: 1
});

const WEEKDAY_MESSAGE = 'Choose a day of the week.';

/** The summary choice form: one schema for the page and its action. */
export const summaryChoiceSchema = z.object({
	summaryEnabled: z.boolean().default(DEFAULT_SUMMARY_CHOICE.summaryEnabled),
	summaryWeekday: wholeNumber({ min: 1, max: WEEKDAYS.length }, WEEKDAY_MESSAGE).default(
		DEFAULT_SUMMARY_CHOICE.summaryWeekday
	)
}) satisfies z.ZodType<SummaryChoice>;

export type SettingsInputResult =
	{ ok: true; settings: UserSettings } | { ok: false; field: keyof UserSettings; message: string };

const INTEGER_TEXT = /^\s*\d{1,4}\s*$/;
const DECIMAL_TEXT = /^\s*\d{0,2}(\.\d{1,6})?\s*$/;

/** A whole number from a form string (or a number); anything else passes on for the schema to refuse. */
function fromIntegerText(value: unknown): unknown {
	if (typeof value !== 'string') return value;
	return INTEGER_TEXT.test(value) ? Number(value) : null;
}

function fromDecimalText(value: unknown): unknown {
	if (typeof value !== 'string') return value;
	const text = value.trim();
	return DECIMAL_TEXT.test(value) && text !== '' && text !== '.' ? Number(text) : null;
}

/** A checkbox: absent or empty when unticked, 'on' (its default value) when ticked. */
function fromCheckbox(value: unknown): unknown {
	if (value === undefined || value === '' || value === 'off') return false;
	if (value === 'on') return true;
	return value;
}

/**
 * Settings from loose input (a form read as text, or JSON), checked by `settingsSchema`; the
 * first bad field comes back with a sentence to show beside it. Unlike `normalizeSettings` nothing
 * falls back silently: a wrong value on a form must be said, not replaced. Zones come back in
 * their canonical spelling.
 *
 * @example readSettingsInput({ instrument: 'alto-sax', timezone: 'Europe/Lisbon', digestHour: '18', digestEnabled: 'on', … })
 * // → { ok: true, settings: { instrument: 'alto-sax', digestHour: 18, digestEnabled: true, … } }
 */
export function readSettingsInput(input: unknown): SettingsInputResult {
	const form: Record<string, unknown> =
		input && typeof input === 'object' && !Array.isArray(input)
			? (input as Record<string, unknown>)
			: {};
	const result = parseFirst(settingsSchema, {
		instrument: typeof form.instrument === 'string' ? form.instrument.trim() : form.instrument,
		dailyMinutes: fromIntegerText(form.dailyMinutes),
		keyOrder: form.keyOrder,
		desiredRetention: fromDecimalText(form.desiredRetention),
		timezone: form.timezone,
		digestHour: fromIntegerText(form.digestHour),
		digestEnabled: fromCheckbox(form.digestEnabled),
		dayStartHour: fromIntegerText(form.dayStartHour),
		newPerDay: fromIntegerText(form.newPerDay)
	});
	if (!result.ok) return result;
	const timezone = canonicalZone(result.value.timezone) as string; // the schema checked it
	return { ok: true, settings: { ...result.value, timezone } };
}
