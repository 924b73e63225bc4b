import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Card, ClassInvitation, ClassMember, User } from '../../../src/lib/server/db/models/index';
import {
	createAssignment,
	decksAssignedTo,
	deleteAssignment,
	updateAssignment
} from '../../../src/lib/server/classes/assignments';
import {
	createClass,
	getClass,
	normalizeJoinCode,
	updateClass
} from '../../../src/lib/server/classes/classes';
import {
	commentsForCards,
	listComments,
	markCommentsSeen,
	postComment
} from '../../../src/lib/server/classes/comments';
import {
	acceptInvitation,
	inviteByEmail,
	previewInvitation
} from '../../../src/lib/server/classes/invitations';
import {
	joinByCode,
	joinByLink,
	leaveClass,
	removeMember
} from '../../../src/lib/server/classes/members';
import { normalizeKey } from '../../../src/lib/server/classes/keys';
import { openTestWorld, type TestWorld } from '../support/world';
import { listMessages, readMessage } from '../../../src/lib/server/mail/outbox';
import { makeDeck, makeUser } from './world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(() => world.close());

const NOW = new Date('2026-03-02T10:00:00Z');

async function classWithDeck(size = 4) {
	const teacher = await makeUser('teacher');
	const created = await createClass(teacher, { name: 'Lantern combo' });
	if (!created.ok) throw new Error(created.message);
	const { deck, licks } = await makeDeck(teacher.id, size);
	return { teacher, cls: created.class, deck, licks };
}

function cardsOf(userId: string) {
	return Card.findAll({ where: { userId }, order: [['newPosition', 'ASC']] });
}

describe('cards made by assignments and members', () => {
	test('assigning a deck makes every member a new card per lick and quality, in deck order', async () => {
		const { teacher, cls, deck, licks } = await classWithDeck(3);
		const learner = await makeUser('learner');
		expect((await joinByCode(learner, cls.code)).ok).toBe(true);
		const made = await createAssignment(
			teacher,
			cls.id,
			{ deckId: deck.id, startDate: '2026-03-02', newPerDay: 4, qualities: ['m7', '7'] },
			NOW
		);
		expect(made.ok).toBe(true);
		const cards = await cardsOf(learner.id);
		// Home quality 7 plus m7: the repeated 7 makes no second card.
		expect(cards.map((c) => [licks.findIndex((l) => l.id === c.lickId), c.quality])).toEqual([
			[0, '7'],
			[0, 'm7'],
			[1, '7'],
			[1, 'm7'],
			[2, '7'],
			[2, 'm7']
		]);
		expect(
			cards.every((c) => c.state === 0 && c.introducedDay === null && c.retiredAt === null)
		).toBe(true);
		expect(cards.every((c) => made.ok && c.assignmentId === made.assignment.id)).toBe(true);
		expect(cards[0].due.toISOString()).toBe(NOW.toISOString());
	});

	test('a member who joins later gets the cards of every assignment; a card they already had is kept', async () => {
		const { teacher, cls, deck, licks } = await classWithDeck(2);
		const learner = await makeUser('learner');
		const own = await Card.create({
			userId: learner.id,
			lickId: licks[0].id,
			quality: '7',
			due: NOW,
			state: 2
		});
		await createAssignment(
			teacher,
			cls.id,
			{ deckId: deck.id, startDate: '2026-03-02', newPerDay: 1 },
			NOW
		);
		await joinByCode(learner, cls.code!.toLowerCase());
		const cards = await cardsOf(learner.id);
		expect(cards).toHaveLength(2);
		const kept = cards.find((c) => c.id === own.id)!;
		expect([kept.state, kept.assignmentId]).toEqual([2, null]);
	});

	test('leaving retires only still-new cards; rejoining puts them back; practised ones never move', async () => {
		const { teacher, cls, deck } = await classWithDeck(3);
		const learner = await makeUser('learner');
		await joinByCode(learner, cls.code);
		await createAssignment(
			teacher,
			cls.id,
			{ deckId: deck.id, startDate: '2026-03-02', newPerDay: 1 },
			NOW
		);
		const [first] = await cardsOf(learner.id);
		await first.update({ state: 2, introducedDay: '2026-03-02' });
		const left = await leaveClass(learner, cls.id, NOW);
		expect(left).toEqual({ ok: true, retired: 2 });
		const after = await cardsOf(learner.id);
		expect(after.map((c) => c.retiredAt !== null)).toEqual([false, true, true]);
		await joinByCode(learner, cls.code);
		expect((await cardsOf(learner.id)).every((c) => c.retiredAt === null)).toBe(true);
		expect((await removeMember(teacher, cls.id, learner.id, NOW)).ok).toBe(true);
		expect(await ClassMember.count({ where: { classId: cls.id } })).toBe(0);
	});

	test('removing an assignment retires its new cards and keeps the practised ones with the learner', async () => {
		const { teacher, cls, deck } = await classWithDeck(2);
		const learner = await makeUser('learner');
		await joinByCode(learner, cls.code);
		const made = await createAssignment(
			teacher,
			cls.id,
			{ deckId: deck.id, startDate: '2026-03-02', newPerDay: 1 },
			NOW
		);
		if (!made.ok) throw new Error(made.message);
		const [first] = await cardsOf(learner.id);
		await first.update({ state: 2, introducedDay: '2026-03-02' });
		expect(await deleteAssignment(teacher, made.assignment.id, NOW)).toEqual({
			ok: true,
			retired: 1
		});
		const after = await cardsOf(learner.id);
		expect(after.map((c) => [c.state, c.retiredAt !== null])).toEqual([
			[2, false],
			[0, true]
		]);
	});

	test('editing qualities makes the new ones and retires dropped ones; pausing is an edit', async () => {
		const { teacher, cls, deck } = await classWithDeck(1);
		const learner = await makeUser('learner');
		await joinByCode(learner, cls.code);
		const made = await createAssignment(
			teacher,
			cls.id,
			{ deckId: deck.id, startDate: '2026-03-02', newPerDay: 2, qualities: ['m7'] },
			NOW
		);
		if (!made.ok) throw new Error(made.message);
		const edited = await updateAssignment(
			teacher,
			made.assignment.id,
			{ qualities: ['maj7'], paused: true },
			NOW
		);
		expect(edited.ok && [edited.assignment.qualities, edited.assignment.paused]).toEqual([
			['maj7'],
			true
		]);
		const cards = await cardsOf(learner.id);
		expect(cards.map((c) => [c.quality, c.retiredAt !== null]).sort()).toEqual([
			['7', false],
			['m7', true],
			['maj7', false]
		]);
	});

	test('keys are stored as the key list spells them; all twelve are stored as none chosen', async () => {
		const { teacher, cls, deck } = await classWithDeck(1);
		const six = await createAssignment(teacher, cls.id, {
			deckId: deck.id,
			startDate: '2026-03-02',
			newPerDay: 4,
			keys: ['C', 'F', 'A#', 'D#', 'G#', 'C#']
		});
		expect(six.ok && six.assignment.keys).toEqual(['C', 'F', 'Bb', 'Eb', 'Ab', 'Db']);
		const all = await createAssignment(teacher, cls.id, {
			deckId: deck.id,
			startDate: '2026-03-02',
			newPerDay: 4,
			keys: ['C', 'Db', 'D', 'Eb', 'E', 'F', 'F#', 'G', 'Ab', 'A', 'Bb', 'B']
		});
		expect(all.ok && all.assignment.keys).toBeNull();
		// Enharmonic pairs are one key (common practice: F#/Gb, C#/Db).
		expect(['F#', 'Gb', 'C#', 'Cb', 'E#'].map(normalizeKey)).toEqual(['Gb', 'Gb', 'Db', 'B', 'F']);
	});

	test('learners see the decks assigned to their classes, and nothing of classes they left', async () => {
		const { teacher, cls, deck } = await classWithDeck(2);
		const learner = await makeUser('learner');
		await joinByCode(learner, cls.code);
		await createAssignment(teacher, cls.id, {
			deckId: deck.id,
			startDate: '2026-03-02',
			newPerDay: 2,
			targetTempo: 140
		});
		const decks = await decksAssignedTo(learner.id);
		expect(decks.map((d) => [d.deckName, d.className, d.lickCount, d.targetTempo])).toEqual([
			['Test deck', 'Lantern combo', 2, 140]
		]);
		await leaveClass(learner, cls.id);
		expect(await decksAssignedTo(learner.id)).toEqual([]);
	});
});

describe('joining', () => {
	test('a code can be renewed (the old one stops working) and turned off', async () => {
		const { teacher, cls } = await classWithDeck(0);
		const learner = await makeUser('learner');
		const renewed = await updateClass(teacher, cls.id, { joinCode: 'renew' });
		expect(renewed.ok && renewed.class.code).not.toBe(cls.code);
		expect((await joinByCode(learner, cls.code)).ok).toBe(false);
		const off = await updateClass(teacher, cls.id, { joinCode: 'off' });
		expect(off.ok && off.class.code).toBeNull();
		expect(normalizeJoinCode(' ab-cd efgh ')).toBe('ABCDEFGH');
	});

	test('the invite link joins until it is renewed', async () => {
		const { teacher, cls } = await classWithDeck(0);
		const token = new URL(cls.link!).searchParams.get('link')!;
		const learner = await makeUser('learner');
		const joined = await joinByLink(learner, token);
		expect(joined.ok && [joined.joined, joined.className]).toEqual([true, 'Lantern combo']);
		const again = await joinByLink(learner, token);
		expect(again.ok && again.joined).toBe(false);
		await updateClass(teacher, cls.id, { joinLink: 'renew' });
		const late = await makeUser('learner');
		expect((await joinByLink(late, token)).ok).toBe(false);
	});

	test('an archived class takes nobody, pauses its assignments, and comes back when restored', async () => {
		const { teacher, cls, deck } = await classWithDeck(1);
		await createAssignment(teacher, cls.id, {
			deckId: deck.id,
			startDate: '2026-03-02',
			newPerDay: 2
		});
		await updateClass(teacher, cls.id, { archived: true });
		const learner = await makeUser('learner');
		const refused = await joinByCode(learner, cls.code);
		expect(refused.ok ? 'joined' : refused.reason).toBe('conflict');
		const restored = await updateClass(teacher, cls.id, { archived: false });
		expect(restored.ok && restored.class.archived).toBe(false);
		const view = await getClass(teacher, cls.id);
		expect(view.ok && view.class.assignmentCount).toBe(1);
	});

	test('a mailed invitation reaches the outbox and puts whoever opens it in the class, once', async () => {
		const { teacher, cls } = await classWithDeck(0);
		const sent = await inviteByEmail(teacher, cls.id, { email: 'Newcomer@Example.test' });
		expect(sent.ok && [sent.invitation.email, sent.mailSent]).toEqual([
			'newcomer@example.test',
			true
		]);
		const summary = (await listMessages()).find((m) => m.to.includes('newcomer@example.test'))!;
		const mail = await readMessage(summary.id);
		if (!mail.ok) throw new Error(mail.error);
		expect(mail.message.subject).toBe('Tess Marlow invites you to Lantern combo on Twelvefold');
		const link = new URL(mail.message.links.find((l) => l.includes('/join?invitation='))!);
		const token = link.searchParams.get('invitation')!;
		expect(await previewInvitation(token)).toMatchObject({
			className: 'Lantern combo',
			status: 'open'
		});
		const newcomer = await makeUser('learner', 'New Comer');
		const accepted = await acceptInvitation(newcomer, token);
		expect(accepted.ok && accepted.joined).toBe(true);
		expect((await previewInvitation(token))?.status).toBe('accepted');
		const stranger = await makeUser('learner');
		const reused = await acceptInvitation(stranger, token);
		expect(reused.ok ? 'joined' : reused.reason).toBe('conflict');
		const late = await makeUser('learner');
		const tooLate = await acceptInvitation(late, token, new Date('2030-01-01'));
		expect(tooLate.ok ? 'joined' : tooLate.reason).toBe('conflict');
	});
});

test('a teacher whose own address is unconfirmed sends no invitation mail, and nothing is stored', async () => {
	const { teacher, cls } = await classWithDeck(0);
	await User.update({ emailVerifiedAt: null }, { where: { id: teacher.id } });
	const before = (await listMessages()).length;
	const refused = await inviteByEmail(teacher, cls.id, { email: 'someone@example.test' });
	expect(refused.ok ? 'sent' : [refused.reason, refused.message]).toEqual([
		'forbidden',
		expect.stringMatching(/^Confirm your own e-mail address/)
	]);
	expect((await listMessages()).length).toBe(before);
	expect(await ClassInvitation.count({ where: { classId: cls.id } })).toBe(0);
});

describe('comment threads', () => {
	test('teacher and learner write on one thread; reading marks the other side seen', async () => {
		const { teacher, cls, deck } = await classWithDeck(1);
		const learner = await makeUser('learner', 'Lena Reed');
		await joinByCode(learner, cls.code);
		await createAssignment(teacher, cls.id, {
			deckId: deck.id,
			startDate: '2026-03-02',
			newPerDay: 2
		});
		const [card] = await cardsOf(learner.id);
		await postComment(teacher, card.id, { text: 'Lovely in Db. Now try the B version slower.' });
		const forDrill = await commentsForCards(learner.id, [card.id, 'nonsense']);
		expect(forDrill[card.id].map((c) => [c.by, c.seenAt])).toEqual([['teacher', null]]);
		// Another learner's card ids give nothing, whatever is asked.
		const other = await makeUser('learner');
		expect(await commentsForCards(other.id, [card.id])).toEqual({});
		await markCommentsSeen(learner.id, [card.id]);
		await postComment(learner, card.id, { text: 'Will do. B is the hard one.' });
		const thread = await listComments(teacher, card.id);
		expect(thread.ok && thread.items.map((c) => [c.by, c.author.name, c.seenAt !== null])).toEqual([
			['teacher', 'Tess Marlow', true],
			['learner', 'Lena Reed', false]
		]);
		const again = await listComments(learner, card.id);
		expect(again.ok && again.items[1].seenAt !== null).toBe(true);
	});

	test('a teacher loses the thread once the learner has left the class', async () => {
		const { teacher, cls, deck } = await classWithDeck(1);
		const learner = await makeUser('learner');
		await joinByCode(learner, cls.code);
		await createAssignment(teacher, cls.id, {
			deckId: deck.id,
			startDate: '2026-03-02',
			newPerDay: 2
		});
		const [card] = await cardsOf(learner.id);
		await leaveClass(learner, cls.id);
		const refused = await postComment(teacher, card.id, { text: 'Still there?' });
		expect(refused.ok ? 'posted' : refused.reason).toBe('not-found');
	});
});
