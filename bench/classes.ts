/**
 * Class progress at scale, part of `npm run bench`: a class of 40 learners with a year of daily
 * reviews each (12 a day, 175 200 reviews), the service's progress query beside the same
 * aggregate written as one hand-made SQL statement (the ratio is the price of the service's
 * several grouped queries and per-learner clocks); and one learner's heat map over 200 licks.
 * Runs on a fresh SQLite file in a temporary folder.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { QueryTypes, type InferCreationAttributes } from 'sequelize';
import { closeDb, openDb } from '../src/lib/server/db/index';
import { migrate } from '../src/lib/server/db/migrate';
import { Card, Deck, DeckLick, Lick, Review, User } from '../src/lib/server/db/models/index';
import { createAssignment } from '../src/lib/server/classes/assignments';
import { createClass } from '../src/lib/server/classes/classes';
import { joinByCode } from '../src/lib/server/classes/members';
import { classProgress } from '../src/lib/server/classes/progress';
import { learnerDetail } from '../src/lib/server/classes/learner';
import { addDays } from '../src/lib/practice/day';
import { seededRandom } from '../src/lib/practice/random';

const LEARNERS = 40;
const DAYS = 365;
const PER_DAY = 12;
const KEYS = ['C', 'Db', 'D', 'Eb', 'E', 'F', 'Gb', 'G', 'Ab', 'A', 'Bb', 'B'];
const NOW = new Date('2026-12-01T12:00:00Z');
const TODAY = '2026-12-01';

async function median(fn: () => Promise<unknown>, runs = 7): Promise<number> {
	await fn();
	const times: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t0 = performance.now();
		await fn();
		times.push(performance.now() - t0);
	}
	times.sort((a, b) => a - b);
	return times[Math.floor(times.length / 2)];
}

async function makeDeck(ownerId: string, size: number) {
	const deck = await Deck.create({ ownerId, name: `Deck of ${size}` });
	const licks = await Lick.bulkCreate(
		Array.from({ length: size }, (_, i) => ({
			authorId: ownerId,
			title: `Lick ${i + 1}`,
			abc: `X:1\nT:Lick ${i + 1}\nM:4/4\nL:1/8\nK:C\n"C7"cBAG FEDC|`,
			homeKey: 'C',
			homeQuality: '7',
			tempo: 120
		}))
	);
	await DeckLick.bulkCreate(
		licks.map((l, position) => ({ deckId: deck.id, lickId: l.id, position }))
	);
	return { deck, licks };
}

let n = 0;

async function fillReviews(cards: Card[], days: number, perDay: number, random: () => number) {
	let batch: InferCreationAttributes<Review>[] = [];
	for (let d = days; d >= 1; d--) {
		const day = addDays(TODAY, -d + 1);
		for (let i = 0; i < perDay; i++) {
			const card = cards[Math.floor(random() * cards.length)];
			n += 1;
			batch.push({
				cardId: card.id,
				userId: card.userId,
				lickId: card.lickId,
				clientId: `b${n}`,
				reviewedAt: new Date(`${day}T18:${String(i % 60).padStart(2, '0')}:00Z`),
				day,
				grade: 1 + Math.floor(random() * 4),
				key: KEYS[Math.floor(random() * 12)],
				quality: card.quality,
				tempo: 80 + Math.floor(random() * 60),
				revealMs: 20_000,
				gradeMs: 3_000,
				stateBefore: '{}',
				stateAfter: '{}'
			} as InferCreationAttributes<Review>);
			if (batch.length === 2000) {
				await Review.bulkCreate(batch);
				batch = [];
			}
		}
	}
	if (batch.length) await Review.bulkCreate(batch);
}

/** The same figures for the whole class in one statement (every learner in UTC, day start 4). */
const ONE_QUERY = `
WITH scoped AS (
  SELECT r.user_id, r.day, r.key, r.grade, r.reviewed_at,
         COALESCE(r.reveal_ms, 0) + COALESCE(r.grade_ms, 0) AS ms, c.introduced_day
    FROM reviews r JOIN cards c ON c.id = r.card_id
   WHERE r.user_id IN (:userIds) AND c.assignment_id IN (:assignmentIds) AND r.undone_at IS NULL),
basic AS (
  SELECT user_id,
         SUM(CASE WHEN day = :today THEN 1 ELSE 0 END) AS done_today,
         SUM(CASE WHEN day >= :week THEN 1 ELSE 0 END) AS reviews_week,
         SUM(CASE WHEN day >= :week THEN ms ELSE 0 END) AS ms_week,
         SUM(CASE WHEN day >= :month AND introduced_day < day THEN 1 ELSE 0 END) AS learned,
         SUM(CASE WHEN day >= :month AND introduced_day < day AND grade > 1 THEN 1 ELSE 0 END) AS recalled
    FROM scoped WHERE day >= :month GROUP BY user_id),
keyed AS (
  SELECT user_id, key, SUM(CASE WHEN grade > 1 THEN 1.0 ELSE 0 END) / COUNT(*) AS recall,
         ROW_NUMBER() OVER (PARTITION BY user_id ORDER BY SUM(CASE WHEN grade > 1 THEN 1.0 ELSE 0 END) / COUNT(*)) AS rn
    FROM scoped WHERE day >= :sixty GROUP BY user_id, key),
days AS (SELECT user_id, day, MAX(reviewed_at) AS last_at FROM scoped GROUP BY user_id, day),
runs AS (SELECT user_id, day, last_at, CAST(julianday(day) AS INTEGER) - ROW_NUMBER() OVER (PARTITION BY user_id ORDER BY day) AS grp FROM days),
islands AS (SELECT user_id, MAX(day) AS last_day, COUNT(*) AS len, MAX(last_at) AS last_at,
                   ROW_NUMBER() OVER (PARTITION BY user_id ORDER BY MAX(day) DESC) AS rn
              FROM runs GROUP BY user_id, grp),
carded AS (
  SELECT c.user_id, SUM(CASE WHEN c.due <= :now THEN 1 ELSE 0 END) AS due,
         AVG(CASE WHEN c.tempo IS NULL THEN 0.0 ELSE c.tempo * 1.0 / COALESCE(a.target_tempo, l.tempo) END) AS tempo
    FROM cards c JOIN assignments a ON a.id = c.assignment_id JOIN licks l ON l.id = c.lick_id
   WHERE c.user_id IN (:userIds) AND c.assignment_id IN (:assignmentIds) AND c.state > 0 GROUP BY c.user_id)
SELECT u.id, u.name, b.done_today, b.reviews_week, b.ms_week, b.learned, b.recalled,
       (SELECT GROUP_CONCAT(key) FROM keyed k WHERE k.user_id = u.id AND k.rn <= 3) AS weakest,
       i.last_at, CASE WHEN i.last_day >= :yesterday THEN i.len ELSE 0 END AS streak, cd.due, cd.tempo
  FROM users u
  LEFT JOIN basic b ON b.user_id = u.id
  LEFT JOIN islands i ON i.user_id = u.id AND i.rn = 1
  LEFT JOIN carded cd ON cd.user_id = u.id
 WHERE u.id IN (:userIds)`;

export async function benchClasses(): Promise<string[]> {
	const dir = await mkdtemp(path.join(os.tmpdir(), 'twelvefold-bench-classes-'));
	process.env.DATA_DIR = dir;
	const db = openDb(`sqlite:${path.join(dir, 'bench.sqlite')}`);
	try {
		await migrate(db);
		const random = seededRandom('bench-classes');
		const teacherRow = await User.create({
			email: 't@bench.test',
			name: 'Bench Teacher',
			role: 'teacher',
			passwordHash: 'x'
		});
		const teacher = { id: teacherRow.id, role: 'teacher' as const };
		const cls = await createClass(teacher, { name: 'Big class' });
		if (!cls.ok) throw new Error(cls.message);
		const { deck } = await makeDeck(teacher.id, 30);
		const learners = await User.bulkCreate(
			Array.from({ length: LEARNERS }, (_, i) => ({
				email: `l${i}@bench.test`,
				name: `Learner ${i}`,
				role: 'learner' as const,
				passwordHash: 'x'
			}))
		);
		for (const l of learners) await joinByCode({ id: l.id, role: 'learner' }, cls.class.code);
		const assigned = await createAssignment(
			teacher,
			cls.class.id,
			{ deckId: deck.id, startDate: addDays(TODAY, -DAYS), newPerDay: 2 },
			NOW
		);
		if (!assigned.ok) throw new Error(assigned.message);
		await Card.update(
			{ state: 2, introducedDay: addDays(TODAY, -DAYS), due: NOW, tempo: 100 },
			{ where: { assignmentId: assigned.assignment.id } }
		);
		for (const l of learners) {
			const cards = await Card.findAll({ where: { userId: l.id } });
			await fillReviews(cards, DAYS, PER_DAY, random);
		}
		const reviews = await Review.count();

		const serviceMs = await median(async () => {
			const r = await classProgress(teacher, cls.class.id, {}, NOW);
			if (!r.ok || r.items.length !== LEARNERS) throw new Error('progress failed');
		});
		const replacements = {
			userIds: learners.map((l) => l.id),
			assignmentIds: [assigned.assignment.id],
			today: TODAY,
			yesterday: addDays(TODAY, -1),
			week: addDays(TODAY, -6),
			month: addDays(TODAY, -29),
			sixty: addDays(TODAY, -59),
			now: NOW
		};
		const rawMs = await median(async () => {
			const rows = await db.query(ONE_QUERY, { replacements, type: QueryTypes.SELECT });
			if (rows.length !== LEARNERS) throw new Error('raw query failed');
		});

		// One learner with 200 licks, reviewed across the keys for a year.
		const solo = await createClass(teacher, { name: 'Solo' });
		if (!solo.ok) throw new Error(solo.message);
		const big = await makeDeck(teacher.id, 200);
		const learner = learners[0];
		await joinByCode({ id: learner.id, role: 'learner' }, solo.class.code);
		const soloAssignment = await createAssignment(
			teacher,
			solo.class.id,
			{ deckId: big.deck.id, startDate: addDays(TODAY, -DAYS), newPerDay: 5 },
			NOW
		);
		if (!soloAssignment.ok) throw new Error(soloAssignment.message);
		await Card.update(
			{ state: 2, introducedDay: addDays(TODAY, -DAYS), due: NOW },
			{ where: { assignmentId: soloAssignment.assignment.id } }
		);
		const soloCards = await Card.findAll({ where: { assignmentId: soloAssignment.assignment.id } });
		await fillReviews(soloCards, DAYS, 20, random);
		const heatMs = await median(async () => {
			const r = await learnerDetail(teacher, solo.class.id, learner.id);
			if (!r.ok || r.view.rows.length !== 200) throw new Error('heat map failed');
		});

		return [
			`Class progress: ${LEARNERS} learners × ${DAYS} days × ${PER_DAY} reviews (${reviews} reviews in the log)`,
			`  service classProgress (grouped queries + clocks + sort): ${serviceMs.toFixed(1)} ms`,
			`  the same aggregate as one raw SQL statement:            ${rawMs.toFixed(1)} ms`,
			`  Ratio service / one statement: ${(serviceMs / rawMs).toFixed(2)}×`,
			`Heat map: one learner, 200 licks × 12 keys, ${DAYS * 20} reviews: learnerDetail ${heatMs.toFixed(1)} ms`
		];
	} finally {
		await closeDb();
		await rm(dir, { recursive: true, force: true });
	}
}
