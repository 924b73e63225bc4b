import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Card, Comment, Lick, Review } from '../../../src/lib/server/db/models/index';
import { cardStateOf, serializeCardState } from '../../../src/lib/server/study/state';
import type {
	AddCardsAnswer,
	CardAnswer,
	ProgressAnswer,
	ReviewAnswer,
	TodayAnswer
} from '../../../src/lib/practice/api';
import { GET as todayGet } from '../../../src/routes/api/drill/today/+server';
import { POST as reviewPost } from '../../../src/routes/api/drill/reviews/+server';
import { DELETE as reviewDelete } from '../../../src/routes/api/drill/reviews/[id]/+server';
import { GET as cardGet } from '../../../src/routes/api/cards/[id]/+server';
import { POST as cardsPost } from '../../../src/routes/api/cards/+server';
import { GET as progressGet } from '../../../src/routes/api/drill/progress/+server';
import { POST as commentsSeenPost } from '../../../src/routes/api/cards/[id]/comments/seen/+server';
import { dueCounts, learnerStreak, weakestKeys } from '../../../src/lib/server/study/progress';
import { configureEngineBudget } from '../../../src/lib/server/music/render';
import { openTestWorld, type TestWorld } from '../support/world';
import { Interval, Note } from 'tonal';
import { call, makeClass, makeDeck, makeLick, makeUser } from './world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
	// The engine's global budget guards production; these tests are about the drill.
	configureEngineBudget(60_000);
});
afterAll(() => world.close());

/** A learner with one card of their own lick, and the card's id. */
async function learnerWithCard(settings = {}) {
	const learner = await makeUser('learner', settings);
	const lick = await makeLick(learner);
	const added = await call(cardsPost, learner, { method: 'POST', body: { lickId: lick.id } });
	expect(added.status).toBe(201);
	return { learner, lick, cardId: (added.body as unknown as AddCardsAnswer).cardIds[0] };
}

let clientSerial = 0;
const grade = (cardId: string, g: number, extra: Record<string, unknown> = {}) => ({
	cardId,
	key: 'Eb',
	quality: '7',
	grade: g,
	clientId: `client-${++clientSerial}`,
	revealMs: 20_000,
	gradeMs: 3_000,
	...extra
});

describe('every drill route needs a session', () => {
	it.each([
		['GET /api/drill/today', todayGet],
		['POST /api/drill/reviews', reviewPost],
		['DELETE /api/drill/reviews/[id]', reviewDelete],
		['GET /api/cards/[id]', cardGet],
		['POST /api/cards', cardsPost],
		['GET /api/drill/progress', progressGet],
		['POST /api/cards/[id]/comments/seen', commentsSeenPost]
	] as const)('%s answers 401 without one', async (_name, handler) => {
		const { status, body } = await call(handler, null, {
			method: 'POST',
			body: {},
			params: { id: 'x' }
		});
		expect(status).toBe(401);
		expect(body.error?.message).toMatch(/sign in/i);
	});
});

describe('POST /api/cards', () => {
	it('adds a lick over its home quality and chosen ones, and keeps cards already there', async () => {
		const learner = await makeUser();
		const lick = await makeLick(learner);
		const first = await call(cardsPost, learner, {
			method: 'POST',
			body: { lickId: lick.id, qualities: ['m7', 'maj7'] }
		});
		expect(first.status).toBe(201);
		expect(first.body).toMatchObject({ created: 3, existing: 0 });
		const again = await call(cardsPost, learner, {
			method: 'POST',
			body: { lickId: lick.id, qualities: ['m7'] }
		});
		expect(again.body).toMatchObject({ created: 0, existing: 2 });
		expect(await Card.count({ where: { userId: learner.id } })).toBe(3);
	});

	it.each([
		['another learner’s private lick', 'private', false, 404],
		['a public lick', 'public', false, 201],
		['a class lick of a teacher not theirs', 'classes', false, 404],
		['a class lick of their own teacher', 'classes', true, 201]
	] as const)('for %s answers %i', async (_what, visibility, inClass, status) => {
		const author = await makeUser('teacher');
		const learner = await makeUser();
		if (inClass) await makeClass(author, [learner]);
		const lick = await makeLick(author, visibility);
		const res = await call(cardsPost, learner, { method: 'POST', body: { lickId: lick.id } });
		expect(res.status).toBe(status);
		expect(await Card.count({ where: { userId: learner.id } })).toBe(status === 201 ? 1 : 0);
	});

	it('adds a deck of their own, and refuses someone else’s deck', async () => {
		const learner = await makeUser();
		const other = await makeUser();
		const mine = await makeDeck(learner, [
			await makeLick(learner, 'private', 'A'),
			await makeLick(learner, 'private', 'B')
		]);
		const theirs = await makeDeck(other, [await makeLick(other, 'public', 'C')]);
		expect(
			(await call(cardsPost, learner, { method: 'POST', body: { deckId: mine.id } })).body
		).toMatchObject({ created: 2 });
		expect(
			(await call(cardsPost, learner, { method: 'POST', body: { deckId: theirs.id } })).status
		).toBe(404);
	});

	it.each([
		[{ lickId: 'x', qualities: ['nonsense'] }, 404],
		[{}, 400],
		[{ lickId: 'a', deckId: 'b' }, 400],
		[{ lickId: 'a', qualities: 'm7' }, 400]
	])('refuses %j with %i', async (body, status) => {
		const learner = await makeUser();
		expect((await call(cardsPost, learner, { method: 'POST', body })).status).toBe(status);
	});

	it('refuses an unknown quality with 422 and adds nothing', async () => {
		const learner = await makeUser();
		const lick = await makeLick(learner);
		const res = await call(cardsPost, learner, {
			method: 'POST',
			body: { lickId: lick.id, qualities: ['m9b13'] }
		});
		expect(res.status).toBe(422);
		expect(await Card.count({ where: { userId: learner.id } })).toBe(0);
	});
});

describe('GET /api/drill/today', () => {
	it('answers the queue with every prompt rendered for the learner’s instrument', async () => {
		const { learner, lick, cardId } = await learnerWithCard({ instrument: 'alto-sax' });
		const { status, body } = await call(todayGet, learner);
		expect(status).toBe(200);
		const today = body as unknown as TodayAnswer;
		expect(today.items).toHaveLength(1);
		const item = today.items[0];
		expect(item).toMatchObject({
			cardId,
			lickId: lick.id,
			title: 'Test line',
			quality: '7',
			homeQuality: '7',
			instrument: 'alto-sax',
			isNew: true,
			state: 'new',
			targetTempo: 140,
			tempo: 112,
			retrievability: null
		});
		// The variant is the engine's answer for that key: concert key as picked, written for alto.
		expect(item.variant.key).toBe(item.key);
		expect(item.writtenKey).toBe(item.variant.writtenKey);
		expect(item.variant.abc).toMatch(/^X:1/);
		expect(item.variant.notes.length).toBeGreaterThan(0);
		expect(Object.keys(item.previews)).toEqual(['1', '2', '3', '4']);
		expect(new Date(item.previews[1]) < new Date(item.previews[4])).toBe(true);
		expect(today.counts).toMatchObject({ due: 0, new: 1, doneToday: 0 });
		expect(today.backlog).toMatchObject({ overdue: 0, catchUpDays: 0 });
	});

	it('moves the note names of the teaching note into the written key of the prompt', async () => {
		const { learner, lick } = await learnerWithCard({ instrument: 'alto-sax' });
		await Lick.update(
			{ note: 'Lean on the B♭, then let the C7 pull home.' },
			{ where: { id: lick.id } }
		);
		const item = ((await call(todayGet, learner)).body as unknown as TodayAnswer).items[0];
		const to = item.variant.writtenTonic;
		// Reference: tonal 6.5.1, the interval between the tonics applied to each name.
		const by = Interval.distance('F', to);
		const move = (name: string) => Note.transpose(name, by).replace('b', '♭').replace('#', '♯');
		if (to === 'F') {
			expect(item.noteNames).toBe('none');
		} else {
			expect(item.note).toBe(`Lean on the ${move('Bb')}, then let the ${move('C')}7 pull home.`);
			expect(item.noteNames).toBe('moved');
		}
	});

	it('shows nothing of another learner’s cards', async () => {
		await learnerWithCard();
		const stranger = await makeUser();
		const { body } = await call(todayGet, stranger);
		expect((body as unknown as TodayAnswer).items).toEqual([]);
	});
});

describe('POST /api/drill/reviews', () => {
	it('records a review, and the same clientId again records nothing new and answers the same', async () => {
		const { learner, cardId } = await learnerWithCard();
		const body = grade(cardId, 3, { tempo: 112 });
		const first = await call(reviewPost, learner, { method: 'POST', body });
		expect(first.status).toBe(201);
		const a = first.body as unknown as ReviewAnswer;
		expect(a.duplicate).toBe(false);
		expect(a.card).toMatchObject({
			id: cardId,
			state: 1,
			reps: 1,
			version: 1,
			stateName: 'learning'
		});
		// A learning step: it comes back within the sitting, with a prompt ready.
		expect(a.again?.cardId).toBe(cardId);
		expect(a.again?.key).not.toBe('Eb');
		const second = await call(reviewPost, learner, { method: 'POST', body });
		expect(second.status).toBe(200);
		const b = second.body as unknown as ReviewAnswer;
		expect(b.duplicate).toBe(true);
		expect(b.review).toEqual(a.review);
		expect(b.card).toEqual(a.card);
		expect(await Review.count({ where: { userId: learner.id } })).toBe(1);
		expect((await Card.findByPk(cardId))!.version).toBe(1);
	});

	it('answers a resend after a later grade of the same card with the first review, writing nothing', async () => {
		const { learner, cardId } = await learnerWithCard();
		const firstBody = grade(cardId, 3);
		const first = await call(reviewPost, learner, { method: 'POST', body: firstBody });
		expect(first.status).toBe(201);
		const later = await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 4) });
		expect(later.status).toBe(201);
		const resent = await call(reviewPost, learner, { method: 'POST', body: firstBody });
		expect(resent.status).toBe(200);
		const a = first.body as unknown as ReviewAnswer;
		const r = resent.body as unknown as ReviewAnswer;
		expect(r.duplicate).toBe(true);
		expect(r.review).toEqual(a.review);
		expect(r.card).toEqual(a.card);
		// The card has moved on since: it is not offered again from the old answer.
		expect(r.again).toBeNull();
		expect(await Review.count({ where: { userId: learner.id } })).toBe(2);
		expect((await Card.findByPk(cardId))!.version).toBe(2);
	});

	it('answers 404 for another learner’s card and writes nothing', async () => {
		const { cardId } = await learnerWithCard();
		const stranger = await makeUser();
		const res = await call(reviewPost, stranger, { method: 'POST', body: grade(cardId, 4) });
		expect(res.status).toBe(404);
		expect(await Review.count({ where: { cardId } })).toBe(0);
		expect((await Card.findByPk(cardId))!.version).toBe(0);
	});

	it.each([
		[{ grade: 5 }, 422, 'grade'],
		[{ grade: 2.5 }, 422, 'grade'],
		[{ key: 'H' }, 422, 'key'],
		[{ quality: 'm7' }, 422, 'quality'],
		[{ tempo: 9 }, 422, 'tempo'],
		[{ revealMs: -1 }, 422, 'revealMs'],
		[{ reviewedAt: 'yesterday' }, 422, 'reviewedAt'],
		[{ reviewedAt: '2099-01-01T00:00:00Z' }, 422, 'reviewedAt'],
		[{ clientId: '' }, 400, 'clientId'],
		[{ clientId: 'x'.repeat(65) }, 400, 'clientId'],
		[{ bogus: 1 }, 400, 'bogus'],
		[{ cardId: 'not-an-id' }, 404, undefined]
	] as const)('refuses %j with %i and changes nothing', async (patch, status, field) => {
		const { learner, cardId } = await learnerWithCard();
		const res = await call(reviewPost, learner, {
			method: 'POST',
			body: { ...grade(cardId, 3), ...patch }
		});
		expect(res.status).toBe(status);
		if (field) expect((res.body.error as { field?: string }).field).toBe(field);
		expect(await Review.count({ where: { userId: learner.id } })).toBe(0);
	});

	it('refuses a body that is not JSON (415) or not an object (400)', async () => {
		const learner = await makeUser();
		expect(
			(
				await call(reviewPost, learner, {
					method: 'POST',
					body: 'grade=3',
					contentType: 'text/plain'
				})
			).status
		).toBe(415);
		expect((await call(reviewPost, learner, { method: 'POST', body: '[1]' })).status).toBe(400);
		expect((await call(reviewPost, learner, { method: 'POST', body: '{' })).status).toBe(400);
	});

	it('keeps an offline grade’s own time and puts it on that practice day', async () => {
		const { learner, cardId } = await learnerWithCard({ timezone: 'Pacific/Honolulu' });
		const at = new Date(Date.now() - 3 * 3600_000);
		const res = await call(reviewPost, learner, {
			method: 'POST',
			body: grade(cardId, 3, { reviewedAt: at.toISOString() })
		});
		expect(res.status).toBe(201);
		const review = (res.body as unknown as ReviewAnswer).review;
		expect(review.reviewedAt).toBe(at.toISOString());
		const local = new Date(at.getTime() - 10 * 3600_000);
		if (local.getUTCHours() < 4) local.setUTCDate(local.getUTCDate() - 1);
		expect(review.day).toBe(local.toISOString().slice(0, 10));
	});
});

describe('DELETE /api/drill/reviews/[id]', () => {
	it('restores the card byte for byte and marks the review undone', async () => {
		const { learner, cardId } = await learnerWithCard();
		await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 3) });
		const before = serializeCardState(cardStateOf((await Card.findByPk(cardId))!), 0);
		const graded = (
			await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 1, { tempo: 100 }) })
		).body as unknown as ReviewAnswer;
		expect(serializeCardState(cardStateOf((await Card.findByPk(cardId))!), 0)).not.toBe(before);
		const undo = await call(reviewDelete, learner, {
			method: 'DELETE',
			params: { id: graded.review.id }
		});
		expect(undo.status).toBe(200);
		const card = (await Card.findByPk(cardId))!;
		expect(serializeCardState(cardStateOf(card), 0)).toBe(before);
		expect(card.version).toBe(3);
		const row = (await Review.findByPk(graded.review.id))!;
		expect(row.undoneAt).not.toBeNull();
		// Undoing again answers the same and changes nothing.
		const twice = await call(reviewDelete, learner, {
			method: 'DELETE',
			params: { id: graded.review.id }
		});
		expect(twice.status).toBe(200);
		expect((await Card.findByPk(cardId))!.version).toBe(3);
	});

	it('answers 404 for another learner’s review and leaves it alone', async () => {
		const { learner, cardId } = await learnerWithCard();
		const graded = (await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 3) }))
			.body as unknown as ReviewAnswer;
		const stranger = await makeUser();
		const res = await call(reviewDelete, stranger, {
			method: 'DELETE',
			params: { id: graded.review.id }
		});
		expect(res.status).toBe(404);
		expect((await Review.findByPk(graded.review.id))!.undoneAt).toBeNull();
		expect((await Card.findByPk(cardId))!.version).toBe(1);
		expect(
			(await call(reviewDelete, learner, { method: 'DELETE', params: { id: 'nope' } })).status
		).toBe(404);
	});

	it('refuses to undo a review the card has been graded again after (409)', async () => {
		const { learner, cardId } = await learnerWithCard();
		const first = (await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 3) }))
			.body as unknown as ReviewAnswer;
		await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 3) });
		const res = await call(reviewDelete, learner, {
			method: 'DELETE',
			params: { id: first.review.id }
		});
		expect(res.status).toBe(409);
		expect((await Review.findByPk(first.review.id))!.undoneAt).toBeNull();
	});
});

describe('GET /api/cards/[id]', () => {
	it.each([
		['its learner', 'self', 200],
		['a teacher of a class the learner is in', 'teacher', 200],
		['a teacher of another class', 'other-teacher', 404],
		['another learner in the same class', 'classmate', 404],
		['an admin', 'admin', 404]
	] as const)('answers %s with %i', async (_who, who, status) => {
		const { learner, cardId } = await learnerWithCard();
		await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 3) });
		const teacher = await makeUser('teacher');
		const classmate = await makeUser();
		await makeClass(teacher, [learner, classmate]);
		const otherTeacher = await makeUser('teacher');
		await makeClass(otherTeacher, [classmate]);
		const actor = {
			self: learner,
			teacher,
			'other-teacher': otherTeacher,
			classmate,
			admin: await makeUser('admin')
		}[who];
		const res = await call(cardGet, actor, { params: { id: cardId } });
		expect(res.status).toBe(status);
		if (status === 200) {
			const answer = res.body as unknown as CardAnswer;
			expect(answer.card).toMatchObject({ id: cardId, userId: learner.id, reps: 1 });
			expect(answer.reviews).toHaveLength(1);
			expect(answer.reviews[0]).toMatchObject({ grade: 3, key: 'Eb', undoneAt: null });
		}
	});
});

describe('GET /api/drill/progress', () => {
	it('counts today’s reviews, the streak and the keys played', async () => {
		const { learner, cardId } = await learnerWithCard();
		await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 3, { key: 'Gb' }) });
		await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 4, { key: 'A' }) });
		const { status, body } = await call(progressGet, learner);
		expect(status).toBe(200);
		const p = body as unknown as ProgressAnswer;
		expect(p.streak.current).toBe(1);
		expect(p.reviewsPerDay.at(-1)).toEqual({ day: p.today, reviews: 2, passed: 2 });
		expect(p.keys.find((k) => k.key === 'Gb')).toMatchObject({ reviews: 1, strength: 2 / 3 });
		expect(p.keys.find((k) => k.key === 'A')).toMatchObject({ reviews: 1, strength: 1 });
		expect(p.keys.find((k) => k.key === 'C')).toMatchObject({ reviews: 0, strength: null });
		expect(p.retention.byMaturity[0]).toMatchObject({
			maturity: 'learning',
			reviews: 2,
			passed: 2,
			rate: 1
		});
		expect(p.forecast).toHaveLength(14);
		expect(p.tempos).toHaveLength(1);
		expect(p.cards.total).toBe(1);
	});
});

describe('figures other features reuse', () => {
	it('counts due, waiting and introduced cards, the streak and the weakest keys', async () => {
		const { learner, cardId } = await learnerWithCard();
		const lick = await makeLick(learner, 'private', 'Second line');
		await call(cardsPost, learner, { method: 'POST', body: { lickId: lick.id } });
		expect(await dueCounts(learner.id, new Date())).toMatchObject({
			due: 0,
			waitingNew: 2,
			introducedToday: 0
		});
		await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 1, { key: 'B' }) });
		await call(reviewPost, learner, { method: 'POST', body: grade(cardId, 2, { key: 'D' }) });
		// The card is in a learning step, due later within today's practice day.
		expect(await dueCounts(learner.id, new Date())).toMatchObject({
			due: 1,
			waitingNew: 1,
			introducedToday: 1
		});
		expect(await learnerStreak(learner.id, new Date())).toEqual({ current: 1, longest: 1 });
		expect(await weakestKeys(learner.id, new Date(), 2)).toEqual(['B', 'D']);
	});
});

describe('POST /api/cards/[id]/comments/seen', () => {
	it('marks the teacher’s comments on the learner’s card seen, and leaves the learner’s own', async () => {
		const { learner, cardId } = await learnerWithCard();
		const teacher = await makeUser('teacher');
		const theirs = await Comment.create({ cardId, authorId: teacher.id, text: 'Slower in B.' });
		const mine = await Comment.create({ cardId, authorId: learner.id, text: 'Will do.' });
		const res = await call(commentsSeenPost, learner, { method: 'POST', params: { id: cardId } });
		expect(res.status).toBe(204);
		await theirs.reload();
		await mine.reload();
		expect(theirs.seenAt).toBeInstanceOf(Date);
		expect(mine.seenAt).toBeNull();
	});

	it.each([
		['another learner’s card', 'stranger'],
		['an id that is no card', 'nonsense']
	] as const)('answers 404 for %s and marks nothing', async (_name, who) => {
		const { learner, cardId } = await learnerWithCard();
		const teacher = await makeUser('teacher');
		const comment = await Comment.create({ cardId, authorId: teacher.id, text: 'Watch bar 2.' });
		const stranger = await makeUser();
		const res =
			who === 'stranger'
				? await call(commentsSeenPost, stranger, { method: 'POST', params: { id: cardId } })
				: await call(commentsSeenPost, learner, { method: 'POST', params: { id: 'nonsense' } });
		expect(res.status).toBe(404);
		await comment.reload();
		expect(comment.seenAt).toBeNull();
	});
});
