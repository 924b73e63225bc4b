import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ParsedMail } from 'mailparser';
import { openTestWorld, type TestWorld } from '../support/world';
import { runScheduledMail } from '../../../src/lib/server/digest/send';
import { MailSend } from '../../../src/lib/server/db/models/index';
import {
	makeAssignment,
	makeCard,
	makeClass,
	makeComment,
	makeLick,
	makeReview,
	makeUser,
	readOutbox,
	recipientsOf
} from './fixtures';

/**
 * The Daily reminder end to end: rows as the drill and classes write them, one run of the
 * scheduler at a fixed instant, the mail through the real local SMTP server, read back from the
 * outbox with mailparser.
 */
let world: TestWorld;
let mails: ParsedMail[];
// Monday 2 March 2026, 08:00 UTC: the learners below have their reminder at 07:00 UTC.
const now = new Date('2026-03-02T08:00:00Z');

beforeAll(async () => {
	world = await openTestWorld();
	const teacher = await makeUser({
		email: 'rosa@example.com',
		name: 'Rosa Quill',
		role: 'teacher',
		digestHour: 20
	});
	const theo = await makeUser({ email: 'theo@example.com', name: 'Theo Marsh' });
	await makeUser({ email: 'idle@example.com', name: 'Nothing Due' });
	const unverified = await makeUser({ email: 'new@example.com', verified: false });
	const off = await makeUser({ email: 'off@example.com', digestEnabled: false });

	const licks = [];
	for (const title of [
		'Blue turn',
		'Side step',
		'Octave fall',
		'Long fill',
		'Third rail',
		'Quiet one',
		'Up the stairs',
		'Back door',
		'Last call'
	]) {
		licks.push(await makeLick(teacher.id, title));
	}
	// Three reviews due before the practice day ends (05:00 tomorrow is too late for one of them).
	for (const lick of licks.slice(0, 3)) {
		await makeCard(theo.id, lick.id, { state: 2, due: new Date('2026-03-02T18:00:00Z') });
	}
	await makeCard(theo.id, licks[3].id, { state: 2, due: new Date('2026-03-03T05:00:00Z') });
	// Two new licks of the learner's own (pace five a day) and three from a class deck (two a day).
	await makeCard(theo.id, licks[4].id, { state: 0, quality: 'm7' });
	await makeCard(theo.id, licks[5].id, { state: 0, quality: 'm7' });
	const group = await makeClass(teacher.id, 'Tuesday combo', [theo.id]);
	const { assignment } = await makeAssignment(group.id, teacher.id, {
		deckName: 'Enclosures',
		startDate: '2026-03-01',
		newPerDay: 2,
		createdAt: new Date('2026-03-01T10:00:00Z')
	});
	for (const lick of licks.slice(6, 9)) {
		await makeCard(theo.id, lick.id, { state: 0, quality: '7alt', assignmentId: assignment.id });
	}
	// A streak of three days ending yesterday, with trouble in E-flat and F-sharp / G-flat.
	const reviewed = await makeCard(theo.id, licks[0].id, {
		state: 2,
		quality: 'maj7',
		due: new Date('2026-03-09T00:00:00Z')
	});
	const grades: [string, string, number][] = [
		['2026-02-27', 'Eb', 1],
		['2026-02-27', 'Eb', 1],
		['2026-02-28', 'Eb', 3],
		['2026-02-28', 'F#', 2],
		['2026-03-01', 'Gb', 1],
		['2026-03-01', 'C', 4],
		['2026-03-01', 'C', 3],
		['2025-11-20', 'A', 1]
	];
	for (const [day, key, grade] of grades) await makeReview(reviewed, { day, key, grade });
	await makeComment(
		reviewed.id,
		teacher.id,
		'Lean on the b9 in bar two;\nlet it ring.',
		new Date('2026-03-01T12:00:00Z')
	);

	// Due cards for people who must get nothing: unverified, and turned off.
	await makeCard(unverified.id, licks[0].id, { state: 2, due: new Date('2026-03-01T00:00:00Z') });
	await makeCard(off.id, licks[0].id, { state: 2, due: new Date('2026-03-01T00:00:00Z') });

	const report = await runScheduledMail({ now, log: () => {} });
	expect(report).toMatchObject({ sent: 1, failed: 0 });
	mails = await readOutbox(world.dataDir);
});
afterAll(() => world.close());

describe('the Daily reminder', () => {
	it('goes to the learner with licks due and to nobody else', () => {
		expect(mails.map(recipientsOf)).toEqual([['theo@example.com']]);
	});

	it('records a sent row for the learner and a skipped one for the learner with nothing', async () => {
		const rows = await MailSend.findAll({ include: ['User'], order: [['status', 'ASC']] });
		// The teacher's hour (20:00) has not come; unverified and turned-off people are not looked at.
		expect(
			rows.map((r) => [
				(r as unknown as { User: { email: string } }).User.email,
				r.kind,
				r.day,
				r.status
			])
		).toEqual([
			['theo@example.com', 'digest', '2026-03-02', 'sent'],
			['idle@example.com', 'digest', '2026-03-02', 'skipped']
		]);
	});

	it('counts reviews due today, new licks at each source’s pace, and minutes from the learner’s own timings', () => {
		const [mail] = mails;
		// The drill's queue: 3 reviews + 2 own new + 2 of the class's 3 (two a day); 24 s a prompt
		// from the learner's timings, three prompts for a new lick: (3 + 4 × 3) × 24 s = 6 min.
		expect(mail.subject).toBe('Today: 7 licks, about 6 minutes');
		expect(mail.text).toContain('to review: 3\nnew today: 4\nminutes, about: 6');
		expect(mail.text).toContain('worked out from how long your recent prompts took you');
	});

	it('says what is new from the teacher since the last reminder', () => {
		const text = mails[0].text!;
		expect(text).toContain(
			'- Rosa Quill assigned “Enclosures” in Tuesday combo: 2 new licks a day.'
		);
		expect(text).toContain(
			'- Rosa Quill on “Blue turn” (maj7): “Lean on the b9 in bar two; let it ring.”'
		);
	});

	it('gives the streak and that today keeps it', () => {
		expect(mails[0].text).toContain('3 days in a row. Practise today to make it 4.');
	});

	it('names the three weakest keys by the drill’s key strength, enharmonic spellings together', () => {
		// Mean grade mapped to 0–1: G♭ and F♯ (1, 2) 17 %, E♭ (1, 1, 3) 22 %, C (3, 4) 83 %.
		expect(mails[0].text).toContain(
			'- G♭: strength 17\u00a0% over 2 prompts\n' +
				'- E♭: strength 22\u00a0% over 3 prompts\n' +
				'- C: strength 83\u00a0% over 2 prompts\n'
		);
		// A was missed, but over three months ago.
		expect(mails[0].text).not.toMatch(/^- A:/m);
	});

	it('has a button to today’s drill, both parts and a line of our own', () => {
		const [mail] = mails;
		expect(mail.html).toContain('href="http://twelvefold.test/drill"');
		expect(mail.html).toContain('Start today’s drill');
		expect(mail.text).toContain('Start today’s drill:\nhttp://twelvefold.test/drill');
		expect(mail.html).toContain(
			'<meta name="viewport" content="width=device-width, initial-scale=1">'
		);
	});

	it('carries List-Unsubscribe for one-click and an unsubscribe link in the footer', () => {
		const [mail] = mails;
		const header = (name: string) =>
			mail.headerLines
				.find((h) => h.key === name)
				?.line.replace(/^[^:]+:\s*/, '')
				.replace(/\r?\n\s+/g, '');
		expect(header('list-unsubscribe')).toMatch(
			/^<http:\/\/twelvefold\.test\/api\/unsubscribe\?token=[0-9a-f-]{36}\.digest\.[A-Za-z0-9_-]{43}>$/
		);
		expect(header('list-unsubscribe-post')).toBe('List-Unsubscribe=One-Click');
		expect(mail.text).toMatch(/Unsubscribe: http:\/\/twelvefold\.test\/unsubscribe\?token=\S+\n$/);
	});
});
