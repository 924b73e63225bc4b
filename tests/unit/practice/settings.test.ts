import { describe, expect, test } from 'vitest';
import { INSTRUMENT_IDS } from '../../../src/lib/music/instruments';
import {
	DEFAULT_SETTINGS,
	DEFAULT_SUMMARY_CHOICE,
	normalizeSettings,
	readSettingsInput,
	summaryChoiceSchema,
	WEEKDAYS,
	type UserSettings
} from '../../../src/lib/practice/settings';

/** A complete, valid submission of the practice form, as the browser sends it. */
const FORM = {
	instrument: 'alto-sax',
	dailyMinutes: '20',
	keyOrder: 'fourths',
	desiredRetention: '0.85',
	timezone: 'Europe/Lisbon',
	digestHour: '18',
	digestEnabled: 'on',
	dayStartHour: '5',
	newPerDay: '8'
};

const SAVED: UserSettings = {
	instrument: 'alto-sax',
	dailyMinutes: 20,
	keyOrder: 'fourths',
	desiredRetention: 0.85,
	timezone: 'Europe/Lisbon',
	digestHour: 18,
	digestEnabled: true,
	dayStartHour: 5,
	newPerDay: 8
};

describe('readSettingsInput', () => {
	test('a complete form becomes typed settings', () => {
		expect(readSettingsInput(FORM)).toEqual({ ok: true, settings: SAVED });
	});

	test('every instrument of the music engine is accepted', () => {
		for (const instrument of INSTRUMENT_IDS) {
			expect(readSettingsInput({ ...FORM, instrument }), instrument).toMatchObject({
				ok: true,
				settings: { instrument }
			});
		}
	});

	test.each([
		// Bounds are inclusive (5–120 minutes, 0–23 h, 0.70–0.97 retention).
		[{ dailyMinutes: '5' }, { dailyMinutes: 5 }],
		[{ dailyMinutes: ' 120 ' }, { dailyMinutes: 120 }],
		[{ digestHour: '0' }, { digestHour: 0 }],
		[{ digestHour: '23' }, { digestHour: 23 }],
		[{ desiredRetention: '0.7' }, { desiredRetention: 0.7 }],
		[{ desiredRetention: '.97' }, { desiredRetention: 0.97 }],
		[{ desiredRetention: '0.900' }, { desiredRetention: 0.9 }],
		[{ keyOrder: 'weighted' }, { keyOrder: 'weighted' }],
		[{ dayStartHour: '0' }, { dayStartHour: 0 }],
		[{ dayStartHour: '23' }, { dayStartHour: 23 }],
		[{ newPerDay: '1' }, { newPerDay: 1 }],
		[{ newPerDay: '20' }, { newPerDay: 20 }],
		// An unticked checkbox is simply absent from the form.
		[{ digestEnabled: undefined }, { digestEnabled: false }],
		[{ digestEnabled: '' }, { digestEnabled: false }],
		// Zones are stored in their canonical spelling.
		[{ timezone: ' europe/berlin ' }, { timezone: 'Europe/Berlin' }],
		[{ timezone: 'UTC' }, { timezone: 'UTC' }],
		[{ timezone: 'America/Argentina/Buenos_Aires' }, { timezone: 'America/Buenos_Aires' }],
		// JSON callers may send real numbers and booleans.
		[{ dailyMinutes: 30, digestHour: 6, desiredRetention: 0.95, digestEnabled: false }, {}]
	])('%j is accepted as %j', (change, expected) => {
		const result = readSettingsInput({ ...FORM, ...change });
		expect(result.ok).toBe(true);
		expect(result.ok && result.settings).toMatchObject(expected);
	});

	test.each([
		[{ instrument: 'kazoo' }, 'instrument'],
		[{ instrument: '' }, 'instrument'],
		[{ instrument: 'ALTO-SAX' }, 'instrument'],
		[{ instrument: ['alto-sax'] }, 'instrument'],
		[{ instrument: undefined }, 'instrument'],
		[{ dailyMinutes: '4' }, 'dailyMinutes'],
		[{ dailyMinutes: '121' }, 'dailyMinutes'],
		[{ dailyMinutes: '15.5' }, 'dailyMinutes'],
		[{ dailyMinutes: '1e2' }, 'dailyMinutes'],
		[{ dailyMinutes: '' }, 'dailyMinutes'],
		[{ dailyMinutes: '-10' }, 'dailyMinutes'],
		[{ dailyMinutes: 'twenty' }, 'dailyMinutes'],
		[{ dailyMinutes: Number.NaN }, 'dailyMinutes'],
		[{ keyOrder: 'random' }, 'keyOrder'],
		[{ keyOrder: '' }, 'keyOrder'],
		[{ keyOrder: undefined }, 'keyOrder'],
		[{ desiredRetention: '0.69' }, 'desiredRetention'],
		[{ desiredRetention: '0.98' }, 'desiredRetention'],
		[{ desiredRetention: '1' }, 'desiredRetention'],
		[{ desiredRetention: '90' }, 'desiredRetention'],
		[{ desiredRetention: '0,9' }, 'desiredRetention'],
		[{ desiredRetention: '.' }, 'desiredRetention'],
		[{ desiredRetention: '' }, 'desiredRetention'],
		[{ desiredRetention: 'NaN' }, 'desiredRetention'],
		[{ desiredRetention: Infinity }, 'desiredRetention'],
		[{ timezone: 'Nowhere/Atlantis' }, 'timezone'],
		[{ timezone: '' }, 'timezone'],
		[{ timezone: '+01:00' }, 'timezone'],
		[{ timezone: 'Europe/Berlin; DROP TABLE users' }, 'timezone'],
		[{ timezone: 'A'.repeat(200) }, 'timezone'],
		[{ timezone: 42 }, 'timezone'],
		[{ digestHour: '24' }, 'digestHour'],
		[{ digestHour: '-1' }, 'digestHour'],
		[{ digestHour: '7:00' }, 'digestHour'],
		[{ digestHour: '' }, 'digestHour'],
		[{ digestEnabled: 'yes please' }, 'digestEnabled'],
		[{ digestEnabled: 1 }, 'digestEnabled'],
		[{ dayStartHour: '24' }, 'dayStartHour'],
		[{ dayStartHour: '' }, 'dayStartHour'],
		[{ dayStartHour: undefined }, 'dayStartHour'],
		[{ newPerDay: '0' }, 'newPerDay'],
		[{ newPerDay: '21' }, 'newPerDay'],
		[{ newPerDay: '2.5' }, 'newPerDay'],
		[{ newPerDay: undefined }, 'newPerDay']
	])('%j is refused on the field %s', (change, field) => {
		const result = readSettingsInput({ ...FORM, ...change });
		expect(result).toMatchObject({ ok: false, field });
		expect(!result.ok && result.message).toMatch(/^[A-Z].{10,}\.$/);
	});

	test.each([[null], [undefined], ['instrument=alto-sax'], [42], [[FORM]], [{}]])(
		'garbage %j is refused, never turned into defaults',
		(garbage) => {
			expect(readSettingsInput(garbage)).toMatchObject({ ok: false, field: 'instrument' });
		}
	);

	test('the defaults themselves pass the form check once written as form strings', () => {
		const asForm = {
			...DEFAULT_SETTINGS,
			dailyMinutes: String(DEFAULT_SETTINGS.dailyMinutes),
			digestHour: String(DEFAULT_SETTINGS.digestHour),
			desiredRetention: String(DEFAULT_SETTINGS.desiredRetention),
			dayStartHour: String(DEFAULT_SETTINGS.dayStartHour),
			newPerDay: String(DEFAULT_SETTINGS.newPerDay),
			digestEnabled: DEFAULT_SETTINGS.digestEnabled ? 'on' : undefined
		};
		expect(readSettingsInput(asForm)).toEqual({ ok: true, settings: DEFAULT_SETTINGS });
	});

	test('the messages say what to enter', () => {
		const messages = Object.fromEntries(
			(
				[
					['instrument', 'kazoo'],
					['dailyMinutes', '0'],
					['desiredRetention', '0.5'],
					['digestHour', '30'],
					['dayStartHour', '25'],
					['newPerDay', '50']
				] as const
			).map(([field, bad]) => {
				const result = readSettingsInput({ ...FORM, [field]: bad });
				return [field, result.ok ? null : result.message];
			})
		);
		expect(messages).toEqual({
			instrument: 'Choose one of the instruments in the list.',
			dailyMinutes: 'Enter a whole number of minutes from 5 to 120.',
			desiredRetention: 'Choose how much to remember: a share from 0.70 to 0.97.',
			digestHour: 'Choose an hour of the day from 0 to 23.',
			dayStartHour: 'Choose the hour your practice day starts, from 0 to 23.',
			newPerDay: 'Enter a whole number of new licks a day from 1 to 20.'
		});
	});
});

describe('normalizeSettings', () => {
	test.each([
		[null, DEFAULT_SETTINGS],
		['not json', DEFAULT_SETTINGS],
		[
			{ dayStartHour: 6, newPerDay: 12 },
			{ ...DEFAULT_SETTINGS, dayStartHour: 6, newPerDay: 12 }
		],
		[{ dayStartHour: 24, newPerDay: 0 }, DEFAULT_SETTINGS],
		['{"digestHour":20,"bogus":1}', { ...DEFAULT_SETTINGS, digestHour: 20 }]
	])('a stored %j loads as %j', (stored, expected) => {
		expect(normalizeSettings(stored)).toEqual(expected);
	});

	test('the practice day starts at 4 and five new licks come a day unless chosen otherwise', () => {
		expect(DEFAULT_SETTINGS).toMatchObject({ dayStartHour: 4, newPerDay: 5 });
	});
});

describe('the Weekly class summary choice', () => {
	test('ISO weekdays 1 (Monday) to 7 (Sunday) are the only days; nothing sent means the defaults', () => {
		// ISO 8601 numbers the days of the week 1 = Monday … 7 = Sunday.
		expect([WEEKDAYS[0], WEEKDAYS[6]]).toEqual(['Monday', 'Sunday']);
		expect(summaryChoiceSchema.parse({})).toEqual(DEFAULT_SUMMARY_CHOICE);
		expect(summaryChoiceSchema.parse({ summaryEnabled: false, summaryWeekday: 7 })).toEqual({
			summaryEnabled: false,
			summaryWeekday: 7
		});
		for (const day of [0, 8, 2.5]) {
			const result = summaryChoiceSchema.safeParse({ summaryEnabled: true, summaryWeekday: day });
			expect(result.success).toBe(false);
			expect(result.error?.issues[0].message).toBe('Choose a day of the week.');
		}
	});
});
