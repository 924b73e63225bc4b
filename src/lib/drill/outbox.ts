/**
 * The grades outbox: every grade is written here first and sent from here, in the order given,
 * so that a dropped network loses nothing and changes no order. An undo either takes back a grade
 * still waiting (it is never sent) or waits in line behind it as a deletion. Storage is behind a
 * small interface (IndexedDB in the browser, memory in tests); every change and every send runs
 * one at a time, so an undo can never slip between a grade's send and its acknowledgement.
 */
import type { ReviewAnswer, ReviewBody } from './types';

export type OutboxOp =
	| { seq: number; userId: string; kind: 'review'; clientId: string; body: ReviewBody }
	| { seq: number; userId: string; kind: 'undo'; clientId: string };

/** An op before storage gives it its place in line. */
export type NewOutboxOp =
	| Omit<Extract<OutboxOp, { kind: 'review' }>, 'seq'>
	| Omit<Extract<OutboxOp, { kind: 'undo' }>, 'seq'>;

export interface OutboxStore {
	/** Stores the op after every other one and answers its place in line. */
	append(op: NewOutboxOp): Promise<number>;
	/** A user's waiting ops, in any order. */
	list(userId: string): Promise<OutboxOp[]>;
	remove(seq: number): Promise<void>;
	/** The server's id of a review once it has been acknowledged. */
	reviewIdOf(clientId: string): Promise<string | null>;
	rememberReviewId(clientId: string, reviewId: string): Promise<void>;
}

/** The result of one attempt to send an op. */
export type SendResult =
	| { kind: 'sent'; answer?: ReviewAnswer }
	/**
	 * No network, a server error or a rate limit: keep the op and try again later. `offline` when
	 * the request never reached a server (the browser's own online flag is not to be trusted).
	 */
	| { kind: 'retry'; message: string; offline?: boolean }
	/** Signed out: keep everything until the learner signs in again. */
	| { kind: 'signed-out' }
	/** The server will never take it (a 4xx other than 401/408/429): drop it and say so. */
	| { kind: 'refused'; status: number; message: string };

export interface Sender {
	review(body: ReviewBody): Promise<SendResult>;
	undo(reviewId: string): Promise<SendResult>;
}

export interface FlushReport {
	sent: number;
	refused: { op: OutboxOp; message: string }[];
	/** Why sending stopped with ops still waiting, if it did. */
	stopped: 'retry' | 'signed-out' | null;
	waiting: number;
	/** What the attempt showed of the network: `offline` no request got through, `online` a
	 * server answered, null nothing was sent. */
	network: 'online' | 'offline' | null;
}

/**
 * The order ops go out in: their place in line (the grades' own order), never their times.
 * @example sendOrder([{ seq: 2, … }, { seq: 1, … }]).map((o) => o.seq) // [1, 2]
 */
export function sendOrder(ops: readonly OutboxOp[]): OutboxOp[] {
	return [...ops].sort((a, b) => a.seq - b.seq);
}

export class Outbox {
	#chain: Promise<unknown> = Promise.resolve();

	constructor(
		private readonly store: OutboxStore,
		private readonly userId: string
	) {}

	/** Runs `task` after every task queued before it, whatever became of them. */
	#serial<T>(task: () => Promise<T>): Promise<T> {
		const run = this.#chain.then(task, task);
		this.#chain = run.catch(() => undefined);
		return run;
	}

	/** Keep a grade to send. */
	addReview(body: ReviewBody): Promise<number> {
		return this.#serial(() =>
			this.store.append({ userId: this.userId, kind: 'review', clientId: body.clientId, body })
		);
	}

	/**
	 * Take a grade back: dropped if it is still waiting (answers `cancelled`), otherwise a
	 * deletion queued behind everything before it (answers `queued`).
	 */
	addUndo(clientId: string): Promise<'cancelled' | 'queued'> {
		return this.#serial(async () => {
			const ops = await this.store.list(this.userId);
			const waiting = ops.find((o) => o.kind === 'review' && o.clientId === clientId);
			if (waiting) {
				// A deletion queued for an earlier undo of the same grade can no longer exist (the grade
				// is back in line only through a new review), so dropping the grade is the whole undo.
				await this.store.remove(waiting.seq);
				return 'cancelled';
			}
			await this.store.append({ userId: this.userId, kind: 'undo', clientId });
			return 'queued';
		});
	}

	/** How many ops wait to be sent. */
	count(): Promise<number> {
		return this.#serial(async () => (await this.store.list(this.userId)).length);
	}

	/**
	 * Send what waits, oldest first, each after the one before has been acknowledged; stop at the
	 * first op that must wait (no network, server trouble, signed out). `onSent` hears each
	 * acknowledged review with the server's answer.
	 */
	flush(
		sender: Sender,
		onSent?: (op: OutboxOp, answer: ReviewAnswer | undefined) => void
	): Promise<FlushReport> {
		return this.#serial(async () => {
			const report: FlushReport = {
				sent: 0,
				refused: [],
				stopped: null,
				waiting: 0,
				network: null
			};
			const ops = sendOrder(await this.store.list(this.userId));
			let i = 0;
			for (; i < ops.length; i++) {
				const op = ops[i];
				let result: SendResult;
				let asked = true;
				if (op.kind === 'review') {
					result = await sender.review(op.body);
				} else {
					const reviewId = await this.store.reviewIdOf(op.clientId);
					// Never acknowledged and no longer waiting: nothing reached the server to take back.
					asked = reviewId !== null;
					result = reviewId ? await sender.undo(reviewId) : { kind: 'sent' };
				}
				if (asked)
					report.network = result.kind === 'retry' && result.offline ? 'offline' : 'online';
				if (result.kind === 'retry' || result.kind === 'signed-out') {
					report.stopped = result.kind;
					break;
				}
				if (result.kind === 'refused') {
					report.refused.push({ op, message: result.message });
				} else {
					report.sent++;
					if (op.kind === 'review' && result.answer) {
						await this.store.rememberReviewId(op.clientId, result.answer.review.id);
					}
					onSent?.(op, result.answer);
				}
				await this.store.remove(op.seq);
			}
			report.waiting = ops.length - i;
			return report;
		});
	}
}

/** An outbox kept in memory: for tests, and for browsers without IndexedDB. */
export class MemoryOutboxStore implements OutboxStore {
	#ops: OutboxOp[] = [];
	#next = 1;
	#ids = new Map<string, string>();

	async append(op: NewOutboxOp): Promise<number> {
		const seq = this.#next++;
		this.#ops.push({ ...op, seq } as OutboxOp);
		return seq;
	}
	async list(userId: string): Promise<OutboxOp[]> {
		return this.#ops.filter((o) => o.userId === userId);
	}
	async remove(seq: number): Promise<void> {
		this.#ops = this.#ops.filter((o) => o.seq !== seq);
	}
	async reviewIdOf(clientId: string): Promise<string | null> {
		return this.#ids.get(clientId) ?? null;
	}
	async rememberReviewId(clientId: string, reviewId: string): Promise<void> {
		this.#ids.set(clientId, reviewId);
	}
}
