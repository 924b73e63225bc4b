/**
 * The drill under load, against the built server (`node build`) in a child process on loopback:
 * 200 concurrent graders, each resending some acknowledged grades with the same client id.
 * Then the server is killed (SIGKILL) mid-run: every grade it acknowledged must be on disk, and
 * the grades resent to a restarted server land exactly once. Bounded: a fixed number of grades,
 * a timeout on every request and on the whole file. Builds the server first when `build/` is
 * missing or older than `src/`.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { createSession, SESSION_COOKIE_NAME } from '../../../src/lib/server/auth/session';
import { Card } from '../../../src/lib/server/db/models/index';
import { addCards } from '../../../src/lib/server/study/cards';
import { openTestWorld, type TestWorld } from '../support/world';
import { ensureBuild, startBuiltServer, type BuiltServer } from '../support/built-server';
import { makeLick, makeUser } from './world';

const GRADERS = 200;
const LEARNERS = 100;
const PER_GRADER = 5;

let world: TestWorld;
let port: number;
let server: BuiltServer | null = null;

async function startServer(): Promise<void> {
	server = await startBuiltServer(world.dataDir);
	// A restarted server listens on a port of its own; the graders read this one.
	port = server.port;
}

async function stopServer(signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
	const running = server;
	server = null;
	await running?.stop(signal);
}

interface Grader {
	cookie: string;
	cardIds: string[];
	quality: Map<string, string>;
}
let graders: Grader[] = [];

beforeAll(async () => {
	ensureBuild();
	world = await openTestWorld();
	const learners: Grader[] = [];
	for (let i = 0; i < LEARNERS; i++) {
		const learner = await makeUser();
		const lick = await makeLick(learner);
		const { cardIds } = await addCards(learner, { lickId: lick.id, qualities: ['m7'] }, new Date());
		const { token } = await createSession(learner.id);
		const cards = await Card.findAll({ where: { id: cardIds } });
		learners.push({
			cookie: `${SESSION_COOKIE_NAME}=${token}`,
			cardIds,
			quality: new Map(cards.map((c) => [c.id, c.quality]))
		});
	}
	// Two graders per learner, both grading both cards: they race on each card's version.
	graders = Array.from({ length: GRADERS }, (_, i) => learners[i % LEARNERS]);
}, 600_000);

afterAll(async () => {
	await stopServer('SIGKILL');
	await world?.close();
});

type Sent = { clientId: string; cardId: string };
type Outcome = {
	acked: Map<string, string>;
	failed: Sent[];
	reasons: string[];
	duplicatesOk: number;
	duplicatesBad: number;
};

/** Every grader sends its grades one after another; all graders at once. */
async function runGraders(
	prefix: string,
	perGrader: number,
	resend: Sent[] = []
): Promise<Outcome> {
	const acked = new Map<string, string>();
	const failed: Sent[] = [];
	const reasons: string[] = [];
	let duplicatesOk = 0;
	let duplicatesBad = 0;
	const post = async (g: Grader, s: Sent) => {
		const res = await fetch(`http://127.0.0.1:${port}/api/drill/reviews`, {
			method: 'POST',
			headers: { 'content-type': 'application/json', cookie: g.cookie },
			body: JSON.stringify({
				cardId: s.cardId,
				key: 'C',
				quality: g.quality.get(s.cardId),
				grade: 1 + (s.clientId.length % 4),
				clientId: s.clientId,
				revealMs: 1000,
				gradeMs: 500
			}),
			// Generous: on a shared, loaded machine a queued write can wait long; a timeout is a failure.
			signal: AbortSignal.timeout(120_000)
		});
		return {
			status: res.status,
			body: (await res.json()) as { review?: { id: string }; duplicate?: boolean }
		};
	};
	const work = graders.map(async (g, i) => {
		const mine: Sent[] = resend.length
			? resend.filter(
					(s) => g.cardIds.includes(s.cardId) && s.clientId.startsWith(`${prefix}-${i}-`)
				)
			: Array.from({ length: perGrader }, (_, j) => ({
					clientId: `${prefix}-${i}-${j}`,
					cardId: g.cardIds[(i + j) % 2]
				}));
		for (const s of mine) {
			try {
				const { status, body } = await post(g, s);
				if ((status === 201 || status === 200) && body.review) {
					acked.set(s.clientId, body.review.id);
					// Every other grade is sent again, as a client unsure of its answer would.
					if (s.clientId.endsWith('0') || s.clientId.endsWith('2')) {
						const again = await post(g, s);
						if (
							again.status === 200 &&
							again.body.duplicate &&
							again.body.review?.id === body.review.id
						)
							duplicatesOk++;
						else duplicatesBad++;
					}
				} else {
					reasons.push(`${status} ${JSON.stringify(body).slice(0, 120)}`);
					failed.push(s);
				}
			} catch (e) {
				reasons.push(String(e).slice(0, 120));
				failed.push(s);
			}
		}
	});
	await Promise.all(work);
	return { acked, failed, reasons, duplicatesOk, duplicatesBad };
}

async function stored(prefix: string): Promise<Map<string, number>> {
	const rows = await world.db.query<{ client_id: string; n: number }>(
		'SELECT client_id, COUNT(*) AS n FROM reviews WHERE client_id LIKE :p GROUP BY client_id',
		{ replacements: { p: `${prefix}-%` }, type: QueryTypes.SELECT }
	);
	return new Map(rows.map((r) => [r.client_id, Number(r.n)]));
}

/** Each card's review count equals its repetitions: no grade applied twice or lost to a race. */
async function cardsConsistent(): Promise<boolean> {
	const counts = await world.db.query<{ card_id: string; n: number }>(
		'SELECT card_id, COUNT(*) AS n FROM reviews WHERE undone_at IS NULL GROUP BY card_id',
		{ type: QueryTypes.SELECT }
	);
	const byCard = new Map(counts.map((c) => [c.card_id, Number(c.n)]));
	const cards = await Card.findAll({ attributes: ['id', 'reps', 'version'] });
	return cards.every((c) => c.reps === (byCard.get(c.id) ?? 0) && c.version === c.reps);
}

describe('200 concurrent graders against the built server', () => {
	it('lose no review and double none, resends included', async () => {
		await startServer();
		const run = await runGraders('a', PER_GRADER);
		await stopServer();
		expect([...new Set(run.reasons)]).toEqual([]);
		expect(run.acked.size).toBe(GRADERS * PER_GRADER);
		expect(run.duplicatesBad).toBe(0);
		expect(run.duplicatesOk).toBeGreaterThan(0);
		const db = await stored('a');
		expect(db.size).toBe(GRADERS * PER_GRADER);
		expect([...db.values()].every((n) => n === 1)).toBe(true);
		expect(await cardsConsistent()).toBe(true);
	}, 900_000);

	it('keeps every acknowledged review when the server is killed mid-run, and resends land once', async () => {
		await startServer();
		const running = runGraders('k', PER_GRADER);
		// Kill it while the graders are busy.
		await new Promise((r) => setTimeout(r, 1500));
		await stopServer('SIGKILL');
		const run = await running;
		expect(run.failed.length).toBeGreaterThan(0);
		const db = await stored('k');
		for (const clientId of run.acked.keys()) expect(db.get(clientId), clientId).toBe(1);
		expect(await cardsConsistent()).toBe(true);

		// The clients send what was not acknowledged again, with the same ids, to a new server.
		await startServer();
		const resend = await runGraders('k', PER_GRADER, run.failed);
		await stopServer();
		expect([...new Set(resend.reasons)]).toEqual([]);
		const after = await stored('k');
		expect(after.size).toBe(GRADERS * PER_GRADER);
		expect([...after.values()].every((n) => n === 1)).toBe(true);
		expect(await cardsConsistent()).toBe(true);
	}, 900_000);
});
