import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ParsedMail } from 'mailparser';
import { openTestWorld, type TestWorld } from '../support/world';
import { fakeEvent } from '../support/fake-event';
import { runScheduledMail } from '../../../src/lib/server/digest/send';
import { readMailChoices } from '../../../src/lib/server/digest/choices';
import { readSettings } from '../../../src/lib/server/study/settings';
import { User } from '../../../src/lib/server/db/models/index';
import { refuseCrossSiteForm } from '../../../src/lib/server/http/cross-site';
import { POST as oneClick, GET as openOneClick } from '../../../src/routes/api/unsubscribe/+server';
import { actions, load } from '../../../src/routes/(auth)/unsubscribe/+page.server';
import { makeCard, makeClass, makeLick, makeUser, readOutbox, recipientsOf } from './fixtures';

/**
 * Unsubscribing from a scheduled mail, signed out: the footer's link opens a page whose button
 * turns the mail off; a mail client's one-click POST to the List-Unsubscribe address does the same
 * with no page; either way the next run sends nothing, and settings show the choice.
 */
let world: TestWorld;
let ada: User;
let bo: User;
let teacher: User;
const monday = new Date('2026-03-02T08:00:00Z');

function mailTo(mails: ParsedMail[], email: string): ParsedMail {
	const mail = mails.find((m) => recipientsOf(m).includes(email));
	if (!mail) throw new Error(`No mail to ${email}`);
	return mail;
}
function footerLink(mail: ParsedMail): URL {
	return new URL(/Unsubscribe: (\S+)\n$/.exec(mail.text!)![1]);
}
function oneClickLink(mail: ParsedMail): URL {
	const line = mail.headerLines.find((h) => h.key === 'list-unsubscribe')!.line;
	return new URL(/<([^>]+)>/.exec(line.replace(/\r?\n\s+/g, ''))![1]);
}
function pageEvent(url: URL, method = 'GET') {
	return fakeEvent({ method, path: url.pathname + url.search, contentType: null });
}
function oneClickEvent(url: URL, body: string, contentType = 'application/x-www-form-urlencoded') {
	return fakeEvent({ method: 'POST', path: url.pathname + url.search, body, contentType });
}
const run = (now: Date) => runScheduledMail({ now, log: () => {} });

beforeAll(async () => {
	world = await openTestWorld();
	teacher = await makeUser({ email: 'rosa@example.com', role: 'teacher', digestHour: 7 });
	ada = await makeUser({ email: 'ada@example.com' });
	bo = await makeUser({ email: 'bo@example.com' });
	const lick = await makeLick(teacher.id, 'Blue turn');
	for (const who of [ada, bo]) {
		await makeCard(who.id, lick.id, { state: 2, due: new Date('2026-02-01T00:00:00Z') });
	}
	// Monday is the summary's default weekday: the teacher gets the Weekly class summary too.
	await makeClass(teacher.id, 'Tuesday combo', [ada.id, bo.id]);
	const report = await run(monday);
	expect(report.sent).toBe(3);
});
afterAll(() => world.close());

describe('the unsubscribe page', () => {
	it('names the mail without signing in, changes nothing on opening, and stops it with its button', async () => {
		const link = footerLink(mailTo(await readOutbox(world.dataDir), 'ada@example.com'));
		expect(link.pathname).toBe('/unsubscribe');
		const page = await load(pageEvent(link) as never);
		expect(page).toEqual({
			valid: true,
			mail: 'Daily reminder',
			kind: 'digest',
			email: 'ada@example.com',
			enabled: true
		});
		expect((await readMailChoices(ada.id))?.digestEnabled).toBe(true);

		expect(await actions.stop(pageEvent(link, 'POST') as never)).toEqual({ done: 'stopped' });
		// Settings read the same column: the practice form's reminder switch is now off.
		expect((await readSettings(ada.id))?.digestEnabled).toBe(false);
		expect(await load(pageEvent(link) as never)).toMatchObject({ enabled: false });
	});

	it('sends no reminder the next day, and one again once it is turned back on', async () => {
		const link = footerLink(mailTo(await readOutbox(world.dataDir), 'ada@example.com'));
		const before = (await readOutbox(world.dataDir)).length;
		await run(new Date('2026-03-03T08:00:00Z'));
		const tuesday = (await readOutbox(world.dataDir)).slice(before);
		expect(tuesday.flatMap(recipientsOf)).toEqual(['bo@example.com']);

		expect(await actions.resume(pageEvent(link, 'POST') as never)).toEqual({ done: 'resumed' });
		await run(new Date('2026-03-04T08:00:00Z'));
		const wednesday = (await readOutbox(world.dataDir)).slice(before + 1);
		expect(wednesday.flatMap(recipientsOf).sort()).toEqual(['ada@example.com', 'bo@example.com']);
	});

	it.each([
		['a missing token', ''],
		['a cut-off token', 'abc.digest.x'],
		['another person’s id under a valid signature', 'SWAP']
	])('refuses %s and changes nothing', async (_title, token) => {
		const real = footerLink(
			mailTo(await readOutbox(world.dataDir), 'bo@example.com')
		).searchParams.get('token')!;
		const given = token === 'SWAP' ? real.replace(/^[^.]+/, ada.id) : token;
		const url = new URL(`http://twelvefold.test/unsubscribe?token=${encodeURIComponent(given)}`);
		expect(await load(pageEvent(url) as never)).toMatchObject({ valid: false });
		const refused = (await actions.stop(pageEvent(url, 'POST') as never)) as { status: number };
		expect(refused.status).toBe(400);
		expect((await readMailChoices(ada.id))?.digestEnabled).toBe(true);
		expect((await readMailChoices(bo.id))?.digestEnabled).toBe(true);
	});
});

describe('one-click unsubscribe (RFC 8058)', () => {
	it('answers 204 with no page and stops the mail the header belongs to', async () => {
		const summary = mailTo(await readOutbox(world.dataDir), 'rosa@example.com');
		expect(summary.subject).toMatch(/^Your classes, week of 23 February: 0 of 2 practised$/);
		const url = oneClickLink(summary);
		expect(url.pathname).toBe('/api/unsubscribe');
		const response = await oneClick(oneClickEvent(url, 'List-Unsubscribe=One-Click') as never);
		expect(response.status).toBe(204);
		expect(await response.text()).toBe('');
		expect(await readMailChoices(teacher.id)).toMatchObject({
			summaryEnabled: false,
			digestEnabled: true
		});
		// The next Monday: no summary.
		const before = (await readOutbox(world.dataDir)).length;
		await run(new Date('2026-03-09T08:00:00Z'));
		const next = (await readOutbox(world.dataDir)).slice(before);
		expect(next.map((m) => m.subject).filter((s) => s?.startsWith('Your classes'))).toEqual([]);
	});

	it('takes the multipart form a client may send as well', async () => {
		const url = oneClickLink(mailTo(await readOutbox(world.dataDir), 'bo@example.com'));
		const form = new FormData();
		form.set('List-Unsubscribe', 'One-Click');
		const request = new Request(url, { method: 'POST', body: form });
		const response = await oneClick({ request, url } as never);
		expect(response.status).toBe(204);
		expect((await readMailChoices(bo.id))?.digestEnabled).toBe(false);
	});

	it.each([
		[
			'a body other than List-Unsubscribe=One-Click',
			'List-Unsubscribe=Yes',
			'application/x-www-form-urlencoded',
			400
		],
		['a JSON body', '{"List-Unsubscribe":"One-Click"}', 'application/json', 415],
		['a bad token', 'List-Unsubscribe=One-Click', 'application/x-www-form-urlencoded', 400]
	])('refuses %s with a clear error and changes nothing', async (title, body, type, status) => {
		await User.update({ digestEnabled: true }, { where: { id: ada.id } });
		const url = oneClickLink(mailTo(await readOutbox(world.dataDir), 'ada@example.com'));
		if (title === 'a bad token') url.searchParams.set('token', 'nope');
		const response = await oneClick(oneClickEvent(url, body, type) as never);
		expect(response.status).toBe(status);
		expect(await response.json()).toMatchObject({ error: { message: expect.any(String) } });
		expect((await readMailChoices(ada.id))?.digestEnabled).toBe(true);
	});

	it('sends a person who opens the header address in a browser to the page', async () => {
		const url = oneClickLink(mailTo(await readOutbox(world.dataDir), 'ada@example.com'));
		try {
			openOneClick({ url } as never);
			expect.unreachable();
		} catch (thrown) {
			expect(thrown).toMatchObject({
				status: 303,
				location: `/unsubscribe?token=${encodeURIComponent(url.searchParams.get('token')!)}`
			});
		}
	});
});

describe('the cross-site form check', () => {
	const post = (path: string, origin: string | null, type = 'application/x-www-form-urlencoded') =>
		new Request(`http://twelvefold.test${path}`, {
			method: 'POST',
			headers: { 'content-type': type, ...(origin ? { origin } : {}) },
			body: 'a=1'
		});
	it.each([
		['a form from another site to a page action', '/settings?/practice', 'http://evil.test', 403],
		['a form with no Origin to a page action', '/settings?/practice', null, 403],
		[
			'a text/plain post from another site to an endpoint',
			'/api/auth/sign-out',
			'http://evil.test',
			403
		],
		['a form from our own origin', '/settings?/practice', 'http://twelvefold.test', null],
		['JSON from another site (a preflight guards it)', '/api/me', 'http://evil.test', null],
		['a mail client’s one-click unsubscribe', '/api/unsubscribe?token=t', null, null]
	])('treats %s as Kit would, with only one-click exempt', (_title, path, origin, status) => {
		const type =
			path === '/api/me'
				? 'application/json'
				: path.startsWith('/api/auth')
					? 'text/plain'
					: undefined;
		const request = post(path, origin, type);
		const refused = refuseCrossSiteForm(request, new URL(request.url));
		expect(refused?.status ?? null).toBe(status);
	});
});
