import { describe, expect, it } from 'vitest';
import {
	MemoryOutboxStore,
	Outbox,
	sendOrder,
	type OutboxOp,
	type SendResult,
	type Sender
} from '../../../src/lib/drill/outbox';
import type { ReviewBody } from '../../../src/lib/drill/types';
import { answer } from './fixtures';

function body(clientId: string, reviewedAt = '2026-03-01T19:00:00.000Z'): ReviewBody {
	return { cardId: `card-${clientId}`, key: 'C', quality: '7', grade: 3, clientId, reviewedAt };
}

/** A server stand-in that records what reaches it and answers as told. */
function server(answers: Record<string, SendResult> = {}) {
	const received: string[] = [];
	let online = true;
	const sender: Sender = {
		async review(b) {
			if (!online) return { kind: 'retry', message: 'No connection.', offline: true };
			received.push(`POST ${b.clientId} ${b.reviewedAt}`);
			return answers[b.clientId] ?? { kind: 'sent', answer: answer(`r-${b.clientId}`) };
		},
		async undo(reviewId) {
			if (!online) return { kind: 'retry', message: 'No connection.', offline: true };
			received.push(`DELETE ${reviewId}`);
			return { kind: 'sent' };
		}
	};
	return { sender, received, setOnline: (v: boolean) => (online = v) };
}

describe('sendOrder', () => {
	it('sends by place in line, not by the time written on the grade', () => {
		const ops: OutboxOp[] = [
			{ seq: 3, userId: 'u', kind: 'undo', clientId: 'a' },
			{
				seq: 1,
				userId: 'u',
				kind: 'review',
				clientId: 'a',
				body: body('a', '2026-03-01T20:00:00Z')
			},
			{
				seq: 2,
				userId: 'u',
				kind: 'review',
				clientId: 'b',
				body: body('b', '2026-03-01T18:00:00Z')
			}
		];
		expect(sendOrder(ops).map((o) => o.seq)).toEqual([1, 2, 3]);
	});
});

describe('Outbox', () => {
	it('keeps grades given offline and sends them in order with their own times when back online', async () => {
		const store = new MemoryOutboxStore();
		const box = new Outbox(store, 'u1');
		const net = server();
		net.setOnline(false);
		await box.addReview(body('a', '2026-03-01T19:00:00.000Z'));
		await box.addReview(body('b', '2026-03-01T19:01:00.000Z'));
		expect(await box.flush(net.sender)).toEqual({
			sent: 0,
			refused: [],
			stopped: 'retry',
			waiting: 2,
			network: 'offline'
		});
		expect(await box.count()).toBe(2);

		net.setOnline(true);
		const heard: string[] = [];
		const report = await box.flush(net.sender, (op, a) =>
			heard.push(`${op.clientId}→${a?.review.id}`)
		);
		expect(report).toEqual({ sent: 2, refused: [], stopped: null, waiting: 0, network: 'online' });
		expect(net.received).toEqual([
			'POST a 2026-03-01T19:00:00.000Z',
			'POST b 2026-03-01T19:01:00.000Z'
		]);
		expect(heard).toEqual(['a→r-a', 'b→r-b']);
		expect(await box.count()).toBe(0);
	});

	it('says what a flush learned of the network: a server error is not a lost connection', async () => {
		const box = new Outbox(new MemoryOutboxStore(), 'u1');
		expect((await box.flush(server().sender)).network).toBeNull();
		await box.addReview(body('a'));
		const busy = server({ a: { kind: 'retry', message: 'The server answered 503.' } });
		expect(await box.flush(busy.sender)).toMatchObject({ stopped: 'retry', network: 'online' });
		// An undo of a grade that never reached the server sends nothing, and so learns nothing.
		await box.addUndo('a');
		const down = server();
		down.setOnline(false);
		expect((await box.flush(down.sender)).network).toBeNull();
	});

	it('drops a waiting grade on undo, so it never reaches the server', async () => {
		const box = new Outbox(new MemoryOutboxStore(), 'u1');
		const net = server();
		await box.addReview(body('a'));
		await box.addReview(body('b'));
		expect(await box.addUndo('b')).toBe('cancelled');
		await box.flush(net.sender);
		expect(net.received).toEqual(['POST a 2026-03-01T19:00:00.000Z']);
	});

	it('deletes an acknowledged grade by its server id, in line after what came before', async () => {
		const box = new Outbox(new MemoryOutboxStore(), 'u1');
		const net = server();
		await box.addReview(body('a'));
		await box.flush(net.sender);
		net.setOnline(false);
		await box.addReview(body('b'));
		expect(await box.addUndo('a')).toBe('queued');
		await box.addReview(body('c'));
		net.setOnline(true);
		await box.flush(net.sender);
		expect(net.received).toEqual([
			'POST a 2026-03-01T19:00:00.000Z',
			'POST b 2026-03-01T19:00:00.000Z',
			'DELETE r-a',
			'POST c 2026-03-01T19:00:00.000Z'
		]);
	});

	it('lets an undo wait for a send already under way instead of slipping past it', async () => {
		const box = new Outbox(new MemoryOutboxStore(), 'u1');
		const received: string[] = [];
		let release!: () => void;
		const gate = new Promise<void>((r) => (release = r));
		const slow: Sender = {
			async review(b) {
				await gate;
				received.push(`POST ${b.clientId}`);
				return { kind: 'sent', answer: answer(`r-${b.clientId}`) };
			},
			async undo(id) {
				received.push(`DELETE ${id}`);
				return { kind: 'sent' };
			}
		};
		await box.addReview(body('a'));
		const flushing = box.flush(slow);
		const undoing = box.addUndo('a');
		release();
		await flushing;
		expect(await undoing).toBe('queued');
		await box.flush(slow);
		expect(received).toEqual(['POST a', 'DELETE r-a']);
	});

	it('drops a refused grade, reports it and goes on with the next', async () => {
		const box = new Outbox(new MemoryOutboxStore(), 'u1');
		const net = server({ a: { kind: 'refused', status: 404, message: 'No such card.' } });
		await box.addReview(body('a'));
		await box.addReview(body('b'));
		const report = await box.flush(net.sender);
		expect(report.sent).toBe(1);
		expect(report.refused.map((r) => [r.op.clientId, r.message])).toEqual([['a', 'No such card.']]);
		expect(await box.count()).toBe(0);
	});

	it('keeps everything while signed out', async () => {
		const box = new Outbox(new MemoryOutboxStore(), 'u1');
		await box.addReview(body('a'));
		const report = await box.flush({
			review: async () => ({ kind: 'signed-out' }),
			undo: async () => ({ kind: 'signed-out' })
		});
		expect(report).toMatchObject({ stopped: 'signed-out', waiting: 1 });
	});

	it("sends only the signed-in learner's grades from a shared browser", async () => {
		const store = new MemoryOutboxStore();
		await new Outbox(store, 'someone-else').addReview(body('x'));
		const box = new Outbox(store, 'u1');
		await box.addReview(body('a'));
		const net = server();
		await box.flush(net.sender);
		expect(net.received).toEqual(['POST a 2026-03-01T19:00:00.000Z']);
		expect(await new Outbox(store, 'someone-else').count()).toBe(1);
	});
});
