/**
 * Today's queue for a learner, with every prompt ready to show offline: the key picked, the
 * notation rendered for the learner's instrument, the tempo ladder's rung, the grade previews.
 */
import { Op, QueryTypes } from 'sequelize';
import { getDb } from '../db/index';
import { Assignment, ClassGroup, Comment, Lick, LickVersion, User } from '../db/models/index';
import type { HandWrittenVersions, QualityId } from '../../music';
import { renderLickVariant } from '../music/render';
import { respellNoteText } from '../../music/note-text';
import type { TodayAnswer, TodayItem } from '../../practice/api';
import { pickKey, type KeyMode, type KeyPlay } from '../../practice/keys';
import {
	buildQueue,
	estimateSecondsPerCard,
	type QueueCard,
	type QueueSource
} from '../../practice/queue';
import { previewDue, retrievability, stateName } from '../../practice/scheduler';
import { promptTempo } from '../../practice/tempo';
import { learnerDay, loadLearner, type Actor, type Learner } from './learner';
import { StudyError } from './cards';

/** A date from a raw row: Date on PostgreSQL, text ('2026-12-01 21:24:35.759 +00:00') on SQLite. */
export function rowDate(value: unknown): Date {
	if (value instanceof Date) return value;
	const text = String(value);
	const m = /^(\d{4}-\d{2}-\d{2}) (\d{2}:\d{2}:\d{2}(?:\.\d+)?) ?([+-]\d{2}:\d{2}|Z)?$/.exec(text);
	return new Date(m ? `${m[1]}T${m[2]}${m[3] ?? 'Z'}` : text);
}

interface CardRow {
	id: string;
	lick_id: string;
	quality: string;
	assignment_id: string | null;
	new_position: number;
	introduced_day: string | null;
	retired_at: unknown;
	due: unknown;
	stability: number;
	difficulty: number;
	scheduled_days: number;
	learning_steps: number;
	reps: number;
	lapses: number;
	state: number;
	last_review: unknown;
	tempo: number | null;
	version: number;
}

export interface LoadedCard extends QueueCard {
	quality: string;
	tempo: number | null;
	version: number;
}

function loadedCardOf(r: CardRow): LoadedCard {
	return {
		id: r.id,
		lickId: r.lick_id,
		quality: r.quality,
		assignmentId: r.assignment_id,
		newPosition: Number(r.new_position),
		introducedDay: r.introduced_day,
		retired: r.retired_at !== null && r.retired_at !== undefined,
		due: rowDate(r.due),
		stability: Number(r.stability),
		difficulty: Number(r.difficulty),
		scheduledDays: Number(r.scheduled_days),
		learningSteps: Number(r.learning_steps),
		reps: Number(r.reps),
		lapses: Number(r.lapses),
		state: Number(r.state),
		lastReview:
			r.last_review === null || r.last_review === undefined ? null : rowDate(r.last_review),
		tempo: r.tempo === null ? null : Number(r.tempo),
		version: Number(r.version)
	};
}

const CARD_COLUMNS = `id, lick_id, quality, assignment_id, new_position, introduced_day, retired_at, due,
	stability, difficulty, scheduled_days, learning_steps, reps, lapses, state, last_review, tempo, version`;

/** The learner's cards that may come up: everything but new cards that will never be introduced. */
async function loadCards(
	userId: string,
	where = '',
	extra: Record<string, unknown> = {}
): Promise<LoadedCard[]> {
	const rows = await getDb().query<CardRow>(
		`SELECT ${CARD_COLUMNS} FROM cards WHERE user_id = :userId
		 AND (state <> 0 OR (retired_at IS NULL AND introduced_day IS NULL)) ${where}`,
		{ replacements: { userId, ...extra }, type: QueryTypes.SELECT }
	);
	return rows.map(loadedCardOf);
}

/** Is an assignment bringing new cards on `day`? */
function sourceOf(a: Assignment & { ClassGroup?: ClassGroup }, day: string): QueueSource {
	const active =
		!a.pausedAt &&
		a.startDate <= day &&
		(!a.endDate || day <= a.endDate) &&
		!(a.ClassGroup && a.ClassGroup.archivedAt);
	return { newPerDay: a.newPerDay, active };
}

/** Today's queue for a loaded learner, without rendering any prompt. */
async function planToday(learner: Learner, now: Date) {
	const { day, end } = learnerDay(learner, now);
	const db = getDb();
	const q = <T extends object>(sql: string, replacements: Record<string, unknown>) =>
		db.query<T>(sql, { replacements, type: QueryTypes.SELECT });
	const [cards, introduced, reviewedLicks, done, times] = await Promise.all([
		loadCards(learner.id),
		q<{ assignment_id: string | null; lick_id: string }>(
			'SELECT assignment_id, lick_id FROM cards WHERE user_id = :id AND introduced_day = :day',
			{ id: learner.id, day }
		),
		q<{ lick_id: string }>(
			`SELECT DISTINCT r.lick_id FROM reviews r JOIN cards c ON c.id = r.card_id
			 WHERE r.user_id = :id AND r.day = :day AND r.undone_at IS NULL AND c.state = 2`,
			{ id: learner.id, day }
		),
		q<{ n: number }>(
			'SELECT COUNT(*) AS n FROM reviews WHERE user_id = :id AND day = :day AND undone_at IS NULL',
			{ id: learner.id, day }
		),
		q<{ reveal_ms: number | null; grade_ms: number | null }>(
			`SELECT reveal_ms, grade_ms FROM reviews WHERE user_id = :id AND undone_at IS NULL
			 AND reveal_ms IS NOT NULL ORDER BY reviewed_at DESC LIMIT 50`,
			{ id: learner.id }
		)
	]);
	const assignmentIds = [
		...new Set(cards.map((c) => c.assignmentId).filter((a): a is string => !!a))
	];
	const assignments = assignmentIds.length
		? await Assignment.findAll({ where: { id: assignmentIds }, include: [ClassGroup] })
		: [];
	const introducedToday = new Map<string, number>();
	for (const r of introduced) {
		const key = r.assignment_id ?? '';
		introducedToday.set(key, (introducedToday.get(key) ?? 0) + 1);
	}
	const timings = times.map((t) => (t.reveal_ms ?? 0) + (t.grade_ms ?? 0));
	const queue = buildQueue({
		now,
		day,
		dayEnd: end,
		cards,
		sources: new Map(assignments.map((a) => [a.id, sourceOf(a, day)])),
		ownSource: { newPerDay: learner.newPerDay, active: true },
		introducedToday,
		licksIntroducedToday: new Set(introduced.map((r) => r.lick_id)),
		licksReviewedToday: new Set(reviewedLicks.map((r) => r.lick_id)),
		dailyMinutes: learner.dailyMinutes,
		secondsPerCard: estimateSecondsPerCard(timings),
		desiredRetention: learner.desiredRetention
	});
	return {
		day,
		end,
		queue,
		assignments,
		doneToday: Number(done[0]?.n ?? 0),
		/** Whether the minutes come from the learner's own prompt times (five or more). */
		timed: timings.filter((ms) => ms > 0).length >= 5
	};
}

/**
 * The figures of today's queue without its prompts: what the drill will show, for the digest.
 * @example await todayCounts(userId, new Date()) // { day: '2026-03-01', due: 12, new: 3, estimatedMinutes: 9, … }
 */
export async function todayCounts(
	userId: string,
	now: Date
): Promise<{
	day: string;
	due: number;
	new: number;
	estimatedMinutes: number;
	doneToday: number;
	timed: boolean;
}> {
	const learner = await loadLearner(userId);
	if (!learner) throw new StudyError(404, 'No such learner.');
	const { day, queue, doneToday, timed } = await planToday(learner, now);
	return {
		day,
		due: queue.due,
		new: queue.new,
		estimatedMinutes: queue.estimatedMinutes,
		doneToday,
		timed
	};
}

/**
 * `GET /api/drill/today` for the actor.
 * @example await buildToday(me, new Date()) // { day: '2026-03-01', items: [ … ], counts, backlog }
 */
export async function buildToday(actor: Actor, now: Date): Promise<TodayAnswer> {
	const learner = await loadLearner(actor);
	if (!learner) throw new StudyError(404, 'No such learner.');
	const { day, end, queue, assignments, doneToday: done } = await planToday(learner, now);
	const items = await promptsFor(
		learner,
		queue.entries.map((e) => e.card as LoadedCard),
		now,
		assignments
	);
	return {
		day,
		dayEndsAt: end.toISOString(),
		generatedAt: now.toISOString(),
		items,
		counts: {
			due: items.filter((i) => !i.isNew).length,
			new: items.filter((i) => i.isNew).length,
			estimatedMinutes: queue.estimatedMinutes,
			doneToday: done
		},
		backlog: { overdue: queue.overdue, catchUpDays: queue.catchUpDays, dailyCap: queue.dailyCap },
		dailyMinutes: learner.dailyMinutes
	};
}

/** One card's prompt (the `again` of a review answer); null when it cannot be rendered. */
export async function promptForCard(
	learner: Learner,
	cardId: string,
	now: Date,
	whenBusy: 'wait' | 'refuse' = 'wait'
): Promise<TodayItem | null> {
	const [card] = await loadCards(learner.id, 'AND id = :cardId', { cardId });
	if (!card) return null;
	const assignments = card.assignmentId
		? await Assignment.findAll({ where: { id: card.assignmentId } })
		: [];
	const [item] = await promptsFor(learner, [card], now, assignments, whenBusy);
	return item ?? null;
}

/** Render the prompts of `cards`: keys, notation, tempo, previews, comments. */
async function promptsFor(
	learner: Learner,
	cards: readonly LoadedCard[],
	now: Date,
	assignments: readonly Assignment[],
	whenBusy: 'wait' | 'refuse' = 'wait'
): Promise<TodayItem[]> {
	if (cards.length === 0) return [];
	const lickIds = [...new Set(cards.map((c) => c.lickId))];
	const cardIds = cards.map((c) => c.id);
	const [licks, versions, plays, comments] = await Promise.all([
		Lick.findAll({ where: { id: lickIds } }),
		LickVersion.findAll({ where: { lickId: lickIds } }),
		getDb().query<{ lick_id: string; key: string; grade: number; reviewed_at: unknown }>(
			`SELECT lick_id, key, grade, reviewed_at FROM reviews WHERE user_id = :id
			 AND lick_id IN (:lickIds) AND undone_at IS NULL ORDER BY reviewed_at, created_at`,
			{ replacements: { id: learner.id, lickIds }, type: QueryTypes.SELECT }
		),
		Comment.findAll({
			where: { cardId: { [Op.in]: cardIds } },
			include: [{ model: User, attributes: ['name'] }],
			order: [['createdAt', 'ASC']]
		})
	]);
	const lickById = new Map(licks.map((l) => [l.id, l]));
	const assignmentById = new Map(assignments.map((a) => [a.id, a]));
	const history = new Map<string, KeyPlay[]>();
	for (const p of plays) {
		const list = history.get(p.lick_id) ?? [];
		list.push({ key: p.key, grade: Number(p.grade), at: rowDate(p.reviewed_at) });
		history.set(p.lick_id, list);
	}
	const items: TodayItem[] = [];
	for (const card of cards) {
		const lick = lickById.get(card.lickId);
		if (!lick) continue;
		const assignment = card.assignmentId ? assignmentById.get(card.assignmentId) : undefined;
		const allowed = assignment?.keys ?? null;
		const past = history.get(lick.id) ?? [];
		const mode: KeyMode = allowed && allowed.length === 1 ? 'fixed' : learner.keyOrder;
		const key = pickKey({ mode, allowed, history: past, seed: `${card.id}:${card.reps}`, now });
		// A second prompt of the same lick today must not repeat this key either.
		history.set(lick.id, [...past, { key, grade: 3, at: now }]);
		const own: HandWrittenVersions = {};
		for (const v of versions) if (v.lickId === lick.id) own[v.quality as QualityId] = v.abc;
		// Through the engine's bounded door, shared with every other route that renders.
		const rendered = await renderLickVariant(
			{ abc: lick.abc, versions: own },
			{ to: key, quality: card.quality as QualityId, instrument: learner.instrument },
			whenBusy
		);
		if (!rendered.ok) {
			if (rendered.status === 503) {
				throw new StudyError(503, rendered.message, undefined, rendered.retryAfterSeconds);
			}
			// A lick its author broke after the card was made: skip it rather than fail the day.
			console.error(
				`drill: card ${card.id} (lick ${lick.id}) does not render: ${rendered.message}`
			);
			continue;
		}
		const variant = rendered.value;
		// The teacher wrote the note about the lick in its home key; the learner reads this key.
		const note = respellNoteText(lick.note, lick.homeKey, variant.writtenTonic);
		const targetTempo = assignment?.targetTempo ?? lick.tempo;
		const previews = previewDue(card.id, card, now, { desiredRetention: learner.desiredRetention });
		items.push({
			cardId: card.id,
			lickId: lick.id,
			title: lick.title,
			key,
			writtenKey: variant.writtenKey,
			quality: card.quality,
			homeQuality: lick.homeQuality,
			instrument: variant.instrument,
			tempo: promptTempo(card.tempo, targetTempo),
			targetTempo,
			swingRatio: lick.swingRatio,
			abc: lick.abc,
			note: note.text,
			noteNames: noteNamesOf(note, lick.homeKey === variant.writtenTonic),
			isNew: card.state === 0,
			state: stateName(card.state),
			due: card.due.toISOString(),
			retrievability: retrievability(card, now, learner.desiredRetention),
			previews: {
				1: previews[1].toISOString(),
				2: previews[2].toISOString(),
				3: previews[3].toISOString(),
				4: previews[4].toISOString()
			},
			variant,
			comments: comments
				.filter((c) => c.cardId === card.id)
				.map((c) => ({
					id: c.id,
					authorName: (c as Comment & { User?: User }).User?.name ?? '',
					text: c.text,
					createdAt: new Date(c.createdAt).toISOString()
				})),
			version: card.version
		});
	}
	return items;
}

/** How the names in a teaching note relate to the prompt's key (`TodayItem.noteNames`). */
function noteNamesOf(
	note: { moved: number; bareLetters: number },
	sameKey: boolean
): TodayItem['noteNames'] {
	if (sameKey) return 'none';
	if (note.moved > 0) return note.bareLetters > 0 ? 'some-moved' : 'moved';
	return note.bareLetters > 0 ? 'home' : 'none';
}
