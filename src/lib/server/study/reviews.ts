/**
 * Recording and undoing reviews. A review is one transaction: the append-only review row (unique
 * per learner and client id, so a resend records nothing new) and the card's new state, written
 * only if the card's version is still the one graded (compare-and-set; a lost race is retried
 * from a fresh read). Undo puts the card back exactly as `state_before` holds it.
 */
import { QueryTypes, UniqueConstraintError } from 'sequelize';
import { getDb } from '../db/index';
import { Assignment, Card, Lick, Review } from '../db/models/index';
import type { GradeValue, ReviewAnswer } from '../../practice/api';
import { balancer } from '../../practice/balance';
import { practiceDay } from '../../practice/day';
import { keyPitchClass } from '../../practice/keys';
import { gradeCard, stateName, type DayRange } from '../../practice/scheduler';

const DAY_MS = 86_400_000;
import { nextRung, promptTempo } from '../../practice/tempo';
import { isId, reviewRecordOf, StudyError } from './cards';
import { learnerDay, loadLearner, type Actor, type Learner } from './learner';
import {
	cardColumns,
	cardStateOf,
	parseCardState,
	schedulingOf,
	serializeCardState
} from './state';
import { promptForCard, rowDate } from './today';

export interface ReviewInput {
	cardId: string;
	key: string;
	quality: string;
	grade: GradeValue;
	tempo: number | null;
	revealMs: number | null;
	gradeMs: number | null;
	clientId: string;
	reviewedAt: Date | null;
	sittingId: string | null;
}

export type ReadResult<T> =
	{ ok: true; value: T } | { ok: false; status: 400 | 422; message: string; field?: string };

const FIELDS = [
	'cardId',
	'key',
	'quality',
	'grade',
	'tempo',
	'revealMs',
	'gradeMs',
	'clientId',
	'reviewedAt',
	'sittingId'
];
const CLIENT_ID = /^[A-Za-z0-9._:-]{1,64}$/;
/** An hour: longer than any prompt takes, so a larger figure is a client's mistake. */
const MAX_MS = 3_600_000;
/** Grades kept offline are accepted for this long after they were made. */
const MAX_AGE_MS = 30 * 86_400_000;
/** Clocks disagree a little; a time further ahead than this is refused. */
const MAX_AHEAD_MS = 5 * 60_000;

/**
 * The body of `POST /api/drill/reviews`, every field checked; the first fault comes back with a
 * sentence and the field.
 * @example readReviewInput({ cardId, key: 'Eb', quality: '7', grade: 3, clientId: 'c-1' }, now).ok // true
 */
export function readReviewInput(body: Record<string, unknown>, now: Date): ReadResult<ReviewInput> {
	const bad = (status: 400 | 422, field: string, message: string) =>
		({ ok: false, status, field, message }) as const;
	const unknown = Object.keys(body).filter((k) => !FIELDS.includes(k));
	if (unknown.length) {
		return bad(400, unknown[0], `Unknown field “${unknown[0]}”: send ${FIELDS.join(', ')}.`);
	}
	const { cardId, key, quality, grade, tempo, revealMs, gradeMs, clientId, reviewedAt, sittingId } =
		body;
	if (typeof cardId !== 'string' || cardId === '')
		return bad(400, 'cardId', 'Send the card’s id in “cardId”.');
	if (typeof clientId !== 'string' || !CLIENT_ID.test(clientId)) {
		return bad(
			400,
			'clientId',
			'“clientId” must be 1–64 letters, digits or . _ : - made by the client.'
		);
	}
	if (typeof key !== 'string' || keyPitchClass(key) === null) {
		return bad(422, 'key', '“key” must be the concert key tonic played, such as C, Eb or F#.');
	}
	if (typeof quality !== 'string' || quality === '')
		return bad(400, 'quality', 'Send the chord quality played in “quality”.');
	if (!Number.isInteger(grade) || (grade as number) < 1 || (grade as number) > 4) {
		return bad(422, 'grade', '“grade” must be a whole number from 1 to 4.');
	}
	const optionalInt = (v: unknown, field: string, min: number, max: number) => {
		if (v === undefined || v === null) return { ok: true as const, value: null };
		if (!Number.isInteger(v) || (v as number) < min || (v as number) > max) {
			return bad(422, field, `“${field}” must be a whole number from ${min} to ${max}.`);
		}
		return { ok: true as const, value: v as number };
	};
	const t = optionalInt(tempo, 'tempo', 20, 400);
	if (!t.ok) return t;
	const r = optionalInt(revealMs, 'revealMs', 0, MAX_MS);
	if (!r.ok) return r;
	const g = optionalInt(gradeMs, 'gradeMs', 0, MAX_MS);
	if (!g.ok) return g;
	let at: Date | null = null;
	if (reviewedAt !== undefined && reviewedAt !== null) {
		if (
			typeof reviewedAt !== 'string' ||
			!/^\d{4}-\d{2}-\d{2}T/.test(reviewedAt) ||
			Number.isNaN(Date.parse(reviewedAt))
		) {
			return bad(
				422,
				'reviewedAt',
				'“reviewedAt” must be an ISO 8601 time such as 2026-03-01T18:30:00Z.'
			);
		}
		at = new Date(reviewedAt);
		if (at.getTime() > now.getTime() + MAX_AHEAD_MS) {
			return bad(422, 'reviewedAt', '“reviewedAt” is in the future; check the device’s clock.');
		}
		if (at.getTime() < now.getTime() - MAX_AGE_MS) {
			return bad(
				422,
				'reviewedAt',
				'“reviewedAt” is more than 30 days ago; such a grade is no longer accepted.'
			);
		}
	}
	if (
		sittingId !== undefined &&
		sittingId !== null &&
		(typeof sittingId !== 'string' || !CLIENT_ID.test(sittingId))
	) {
		return bad(400, 'sittingId', '“sittingId” must be 1–64 letters, digits or . _ : -.');
	}
	return {
		ok: true,
		value: {
			cardId,
			key,
			quality,
			grade: grade as GradeValue,
			tempo: t.value,
			revealMs: r.value,
			gradeMs: g.value,
			clientId,
			reviewedAt: at,
			sittingId: (sittingId as string | undefined) ?? null
		}
	};
}

class VersionConflict extends Error {}

/** Compare-and-set retries before giving up with a 409 (each loses only to another grade). */
const ATTEMPTS = 8;

/**
 * Record one review for the actor; `status` is 201 when it is new, 200 for a resend of a
 * recorded clientId (nothing new written, the same review and card state answered).
 * @example await recordReview(me, input, now) // { status: 201, answer: { review, card, … } }
 */
export async function recordReview(
	actor: Actor,
	input: ReviewInput,
	now: Date
): Promise<{ status: 200 | 201; answer: ReviewAnswer }> {
	const learner = await loadLearner(actor);
	if (!learner) throw new StudyError(404, 'No such learner.');
	const db = getDb();
	// A resend is rare: instead of a look-up before every grade, the review's unique key
	// (learner, clientId) refuses the second insert and the stored review is answered then.
	const resent = async () => {
		const known = await Review.findOne({ where: { userId: learner.id, clientId: input.clientId } });
		return known
			? { status: 200 as const, answer: await answerFor(learner, known, true, now) }
			: null;
	};
	if (!isId(input.cardId)) {
		const known = await resent();
		if (known) return known;
		throw new StudyError(404, 'No such card.');
	}

	for (let attempt = 0; attempt < ATTEMPTS; attempt++) {
		// The card with what sets its target tempo, in one query.
		const card = (await Card.findOne({
			where: { id: input.cardId, userId: learner.id },
			include: [
				{ model: Lick, attributes: ['tempo'] },
				{ model: Assignment, attributes: ['targetTempo'] }
			]
		})) as (Card & { Lick?: Lick; Assignment?: Assignment | null }) | null;
		if (!card) {
			const known = await resent();
			if (known) return known;
			throw new StudyError(404, 'No such card.');
		}
		if (card.quality !== input.quality) {
			const known = await resent();
			if (known) return known;
			throw new StudyError(
				422,
				`This card is over “${card.quality}”, not “${input.quality}”.`,
				'quality'
			);
		}
		const lick = card.Lick;
		const assignment = card.Assignment;
		const target = assignment?.targetTempo ?? lick?.tempo ?? 120;
		const before = cardStateOf(card);
		const reviewedAt = input.reviewedAt ?? now;
		// A grade kept offline may arrive after a later one from another device: never schedule
		// backwards from the card's last review.
		const lastReview = before.lastReview ? new Date(before.lastReview) : null;
		const gradeAt = lastReview && lastReview > reviewedAt ? lastReview : reviewedAt;
		const day = practiceDay(reviewedAt, learner.timeZone, learner.dayStartHour);
		// First find the days the interval may land on, then read only the cards due around them.
		let window: DayRange | null = null;
		gradeCard(card.id, schedulingOf(before), input.grade, gradeAt, {
			desiredRetention: learner.desiredRetention,
			pickDays: (range) => {
				window = range;
				return range.fuzzed;
			}
		});
		const pickDays = window
			? balancer(await loadContext(learner, card.id, card.lickId, gradeAt, window))
			: undefined;
		const result = gradeCard(card.id, schedulingOf(before), input.grade, gradeAt, {
			desiredRetention: learner.desiredRetention,
			pickDays
		});
		const played = input.tempo ?? promptTempo(before.tempo, target);
		const after = {
			due: result.after.due.toISOString(),
			stability: result.after.stability,
			difficulty: result.after.difficulty,
			scheduledDays: result.after.scheduledDays,
			learningSteps: result.after.learningSteps,
			reps: result.after.reps,
			lapses: result.after.lapses,
			state: result.after.state,
			lastReview: result.after.lastReview ? result.after.lastReview.toISOString() : null,
			tempo: nextRung({ rung: before.tempo, played, grade: input.grade, target }),
			introducedDay: before.introducedDay ?? day
		};
		try {
			const review = await db.transaction(async (transaction) => {
				const row = await Review.create(
					{
						cardId: card.id,
						userId: learner.id,
						lickId: card.lickId,
						clientId: input.clientId,
						sittingId: input.sittingId,
						reviewedAt,
						day,
						grade: input.grade,
						key: input.key,
						quality: input.quality,
						tempo: input.tempo,
						revealMs: input.revealMs,
						gradeMs: input.gradeMs,
						stateBefore: serializeCardState(before, card.version),
						stateAfter: serializeCardState(after, card.version + 1)
					},
					{ transaction }
				);
				const [changed] = await Card.update(
					{ ...cardColumns(after), version: card.version + 1 },
					{ where: { id: card.id, version: card.version }, transaction }
				);
				if (changed !== 1) throw new VersionConflict();
				return row;
			});
			return {
				status: 201,
				answer: await answerFor(learner, review, false, now, card.version + 1)
			};
		} catch (error) {
			if (error instanceof VersionConflict) continue;
			if (error instanceof UniqueConstraintError) {
				const known = await resent();
				if (known) return known;
			}
			throw error;
		}
	}
	throw new StudyError(
		409,
		'This card is being graded from elsewhere right now; send the grade again.'
	);
}

/**
 * What balancing needs, for the days an interval may land on (a day of margin either side, as
 * the balancer may step one out to keep siblings apart): review cards due per practice day, and
 * the days a sibling is due. Read through the (user, state, due) index.
 */
async function loadContext(
	learner: Learner,
	cardId: string,
	lickId: string,
	at: Date,
	range: DayRange
) {
	const from = new Date(at.getTime() + (range.min - 2) * DAY_MS);
	const to = new Date(at.getTime() + (range.max + 2) * DAY_MS);
	const rows = await getDb().query<{ lick_id: string; due: unknown }>(
		`SELECT lick_id, due FROM cards WHERE user_id = :id AND state = 2 AND due >= :from
		 AND due < :to AND id <> :cardId`,
		{ replacements: { id: learner.id, cardId, from, to }, type: QueryTypes.SELECT }
	);
	const dueByDay = new Map<string, number>();
	const siblingDays = new Set<string>();
	// Practice days by the quarter hour (every zone's offset is whole quarter hours, so no
	// quarter straddles a day start): a handful of zone look-ups instead of one a card.
	const byQuarter = new Map<number, string>();
	for (const r of rows) {
		const due = rowDate(r.due);
		const quarter = Math.floor(due.getTime() / 900_000);
		let day = byQuarter.get(quarter);
		if (day === undefined) {
			day = practiceDay(due, learner.timeZone, learner.dayStartHour);
			byQuarter.set(quarter, day);
		}
		dueByDay.set(day, (dueByDay.get(day) ?? 0) + 1);
		if (r.lick_id === lickId) siblingDays.add(day);
	}
	return { dueByDay, siblingDays, timeZone: learner.timeZone, dayStartHour: learner.dayStartHour };
}

/**
 * The answer for a stored review: built from the row alone, so a resend gets the same.
 * `cardVersion` is the card's version when the caller has just written it (no need to read it).
 */
async function answerFor(
	learner: Learner,
	review: Review,
	duplicate: boolean,
	now: Date,
	cardVersion?: number
): Promise<ReviewAnswer> {
	const { state, version } = parseCardState(review.stateAfter);
	let again = null;
	if (!review.undoneAt && (state.state === 1 || state.state === 3)) {
		const { end } = learnerDay(learner, now);
		const current =
			cardVersion ??
			(await Card.findByPk(review.cardId, { attributes: ['version'] }))?.version ??
			null;
		// The card comes back today only if nothing has changed it since this review.
		if (current === version && new Date(state.due) < end) {
			try {
				// Not waiting for a busy engine: the grade is saved already, and without `again` the
				// client shows the card again from the prompt it already holds.
				again = await promptForCard(learner, review.cardId, now, 'refuse');
			} catch (error) {
				if (!(error instanceof StudyError && error.status === 503)) throw error;
			}
		}
	}
	return {
		review: reviewRecordOf(review),
		card: { ...state, id: review.cardId, version, stateName: stateName(state.state) },
		duplicate,
		again
	};
}

/**
 * Undo one of the actor's reviews: the card returns exactly to `state_before` (its version
 * still moves on) and the review is marked undone. Only the latest review of a card can be
 * undone: after a later one, 409. Undoing twice answers the same undo again.
 * @example await undoReview(me, reviewId, now) // { review: { undoneAt: '…' }, card: { … } }
 */
export async function undoReview(actor: Actor, reviewId: string, now: Date): Promise<ReviewAnswer> {
	const learner = await loadLearner(actor);
	if (!learner) throw new StudyError(404, 'No such learner.');
	const review = isId(reviewId)
		? await Review.findOne({ where: { id: reviewId, userId: learner.id } })
		: null;
	if (!review) throw new StudyError(404, 'No such review.');
	const before = parseCardState(review.stateBefore);
	const after = parseCardState(review.stateAfter);
	if (review.undoneAt) {
		return {
			review: reviewRecordOf(review),
			card: {
				...before.state,
				id: review.cardId,
				version: after.version + 1,
				stateName: stateName(before.state.state)
			},
			duplicate: true,
			again: null
		};
	}
	await getDb().transaction(async (transaction) => {
		const [changed] = await Card.update(
			{ ...cardColumns(before.state), version: after.version + 1 },
			{ where: { id: review.cardId, userId: learner.id, version: after.version }, transaction }
		);
		if (changed !== 1) {
			throw new StudyError(
				409,
				'This card was graded again after that review; undo the later grade first.'
			);
		}
		await Review.update(
			{ undoneAt: now },
			{ where: { id: review.id, undoneAt: null }, transaction }
		);
	});
	await review.reload();
	return {
		review: reviewRecordOf(review),
		card: {
			...before.state,
			id: review.cardId,
			version: after.version + 1,
			stateName: stateName(before.state.state)
		},
		duplicate: false,
		again: null
	};
}
