import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { isActionFailure, isRedirect } from '@sveltejs/kit';
// @ts-expect-error: Kit's internal entry (what `getRequestEvent` reads from) publishes no types.
import { with_request_store } from '@sveltejs/kit/internal/server';
import { signUp } from '../../../src/lib/server/auth/accounts';
import type { SessionUser } from '../../../src/lib/server/auth/session';
import { DEFAULT_SETTINGS } from '../../../src/lib/practice/settings';
import { settingsOf, updateSettings } from '../../../src/lib/server/study/settings';
import { User } from '../../../src/lib/server/db/models/index';
import { actions, load } from '../../../src/routes/(learn)/settings/+page.server';
import { fakeEvent } from '../support/fake-event';
import { openTestWorld, type TestWorld } from '../support/world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(() => world.close());

const withRequestStore = with_request_store as <T>(
	store: { event: unknown; state: object },
	run: () => T
) => T;

const FORM = {
	instrument: 'alto-sax',
	dailyMinutes: '25',
	keyOrder: 'fourths',
	desiredRetention: '0.85',
	timezone: 'Europe/Lisbon',
	digestHour: '18',
	digestEnabled: 'on',
	dayStartHour: '6',
	newPerDay: '3'
};

/** FORM as typed values. */
const SAVED_FORM = {
	instrument: 'alto-sax',
	dailyMinutes: 25,
	keyOrder: 'fourths',
	desiredRetention: 0.85,
	timezone: 'Europe/Lisbon',
	digestHour: 18,
	digestEnabled: true,
	dayStartHour: 6,
	newPerDay: 3
};

let counter = 0;
async function newLearner(): Promise<SessionUser> {
	counter += 1;
	const made = await signUp({
		email: `practice-${counter}@settings.test`,
		password: 'walking-bass-7',
		name: 'Practice Player',
		role: 'learner'
	});
	if (!made.ok) throw new Error(`sign-up failed: ${JSON.stringify(made)}`);
	return made.user;
}

async function storedSettings(userId: string) {
	return settingsOf((await User.findByPk(userId))!);
}

/** Run a route function as SvelteKit would: inside a request store, so `requireUser` works. */
async function asRequest<T>(
	user: SessionUser | null,
	body: string,
	contentType: string,
	run: (event: never) => T,
	path = '/settings'
) {
	const event = fakeEvent({
		method: 'POST',
		path,
		routeId: '/(learn)/settings',
		body,
		contentType,
		locals: { user, session: null }
	});
	try {
		return {
			result: await withRequestStore({ event, state: {} }, () => run(event as never))
		};
	} catch (thrown) {
		if (isRedirect(thrown)) return { redirect: thrown.location, status: thrown.status };
		throw thrown;
	}
}

const postForm = (user: SessionUser | null, fields: Record<string, string>) =>
	asRequest(
		user,
		new URLSearchParams(fields).toString(),
		'application/x-www-form-urlencoded',
		actions.practice as never
	);

describe('updateSettings', () => {
	test('saves checked settings and hands back the session user with them', async () => {
		const user = await newLearner();
		const result = await updateSettings(user.id, FORM);
		const expected = {
			instrument: 'alto-sax',
			dailyMinutes: 25,
			keyOrder: 'fourths',
			desiredRetention: 0.85,
			timezone: 'Europe/Lisbon',
			digestHour: 18,
			digestEnabled: true,
			dayStartHour: 6,
			newPerDay: 3
		};
		expect(result).toEqual({ ok: true, settings: expected });
		expect(await storedSettings(user.id)).toEqual(expected);
	});

	test('the queried settings are columns of users and are not kept twice in the JSON', async () => {
		const user = await newLearner();
		await updateSettings(user.id, FORM);
		const row = (await User.findByPk(user.id))!;
		expect({
			timezone: row.timezone,
			digestHour: row.digestHour,
			digestEnabled: row.digestEnabled,
			dayStartHour: row.dayStartHour
		}).toEqual({ timezone: 'Europe/Lisbon', digestHour: 18, digestEnabled: true, dayStartHour: 6 });
		expect(row.settings).toEqual({
			instrument: 'alto-sax',
			dailyMinutes: 25,
			keyOrder: 'fourths',
			desiredRetention: 0.85,
			newPerDay: 3
		});
	});

	test('unticking the reminder saves it as off', async () => {
		const user = await newLearner();
		const { digestEnabled: _ticked, ...unticked } = FORM;
		expect(await updateSettings(user.id, unticked)).toMatchObject({ ok: true });
		expect((await storedSettings(user.id)).digestEnabled).toBe(false);
	});

	test.each([
		[{ ...FORM, instrument: 'banjo' }, 'instrument'],
		[{ ...FORM, timezone: 'Mars/Olympus_Mons' }, 'timezone'],
		[{ ...FORM, desiredRetention: '0.99' }, 'desiredRetention'],
		[null, 'instrument']
	])('a refused field (%j) changes nothing', async (input, field) => {
		const user = await newLearner();
		const result = await updateSettings(user.id, input);
		expect(result).toMatchObject({ ok: false, reason: 'invalid', field });
		expect(await storedSettings(user.id)).toEqual(DEFAULT_SETTINGS);
	});

	test('an account that is gone is reported, not created', async () => {
		const result = await updateSettings('00000000-0000-4000-8000-000000000000', FORM);
		expect(result).toEqual({
			ok: false,
			reason: 'not-found',
			message: 'This account no longer exists.'
		});
	});
});

describe('the practice form on /settings', () => {
	test('the page loads the stored settings into the form', async () => {
		const user = await newLearner();
		const { result } = await asRequest(user, '', 'text/plain', load as never);
		expect(result).toMatchObject({ practice: { id: 'practice', data: DEFAULT_SETTINGS } });
	});

	test('a valid form saves and answers 303 back to the page with a success flag', async () => {
		const user = await newLearner();
		const done = await postForm(user, FORM);
		expect(done).toEqual({ status: 303, redirect: '/settings?changed=practice' });
		expect(await storedSettings(user.id)).toMatchObject({
			instrument: 'alto-sax',
			dailyMinutes: 25
		});
	});

	test('a refused field answers 422 with its message and what was typed, and changes nothing', async () => {
		const user = await newLearner();
		const { result } = await postForm(user, { ...FORM, dailyMinutes: '600' });
		expect(isActionFailure(result)).toBe(true);
		expect(result).toMatchObject({
			status: 422,
			data: {
				form: {
					id: 'practice',
					errors: { dailyMinutes: ['Enter a whole number of minutes from 5 to 120.'] },
					data: { ...SAVED_FORM, dailyMinutes: 600 }
				}
			}
		});
		expect(
			Object.keys((result as { data: { form: { errors: object } } }).data.form.errors)
		).toEqual(['dailyMinutes']);
		expect(await storedSettings(user.id)).toEqual(DEFAULT_SETTINGS);
	});

	test.each([
		['a multipart body without its boundary', 'garbage', 'multipart/form-data'],
		['a JSON body', JSON.stringify(FORM), 'application/json']
	])('%s answers 400 and changes nothing', async (_what, body, contentType) => {
		const user = await newLearner();
		const { result } = await asRequest(user, body, contentType, actions.practice as never);
		expect(result).toMatchObject({
			status: 400,
			data: { form: { id: 'practice', message: 'The form could not be read.' } }
		});
		expect(await storedSettings(user.id)).toEqual(DEFAULT_SETTINGS);
	});

	test('an empty form is refused with 422 on its first field', async () => {
		const user = await newLearner();
		const { result } = await postForm(user, {});
		expect(result).toMatchObject({
			status: 422,
			data: { form: { errors: { instrument: ['Choose one of the instruments in the list.'] } } }
		});
		expect(await storedSettings(user.id)).toEqual(DEFAULT_SETTINGS);
	});

	test('a signed-out post is sent to sign in', async () => {
		expect(await postForm(null, FORM)).toEqual({
			status: 303,
			redirect: '/sign-in?next=%2Fsettings'
		});
	});
});
