/**
 * The drill's calls to the server from the browser, each answer sorted into what the outbox and
 * the screen need to know: sent, try again later, signed out, or refused for good.
 */
import type { ReviewAnswer, ReviewBody } from './types';
import type { SendResult, Sender } from './outbox';

/** The message of the repo's error shape, `{error:{message}}`, or a sentence of our own. */
async function messageOf(res: Response): Promise<string> {
	const payload = await res.json().catch(() => null);
	const message = payload?.error?.message;
	return typeof message === 'string' ? message : `The server answered ${res.status}.`;
}

async function classify(res: Response): Promise<SendResult | null> {
	if (res.ok) return null;
	if (res.status === 401) return { kind: 'signed-out' };
	if (res.status === 408 || res.status === 429 || res.status >= 500) {
		return { kind: 'retry', message: await messageOf(res) };
	}
	return { kind: 'refused', status: res.status, message: await messageOf(res) };
}

/**
 * The answer to a review when it has the parts the drill relies on (the review's id and the
 * card's state), else undefined: the grade still counts as sent, it just cannot be undone.
 * @example readReviewAnswer({ review: { id: 'r1' }, card: { due: '…' }, again: null }) // the same object
 */
export function readReviewAnswer(payload: unknown): ReviewAnswer | undefined {
	if (!payload || typeof payload !== 'object') return undefined;
	const p = payload as Partial<ReviewAnswer>;
	if (typeof p.review?.id !== 'string' || !p.card || typeof p.card !== 'object') return undefined;
	return { ...p, again: p.again ?? null } as ReviewAnswer;
}

/** The outbox's sender over `fetch`. */
export const fetchSender: Sender = {
	async review(body: ReviewBody): Promise<SendResult> {
		let res: Response;
		try {
			res = await fetch('/api/drill/reviews', {
				method: 'POST',
				headers: { 'content-type': 'application/json' },
				body: JSON.stringify(body)
			});
		} catch {
			return { kind: 'retry', message: 'No connection.', offline: true };
		}
		const problem = await classify(res);
		if (problem) return problem;
		return { kind: 'sent', answer: readReviewAnswer(await res.json().catch(() => null)) };
	},
	async undo(reviewId: string): Promise<SendResult> {
		let res: Response;
		try {
			res = await fetch(`/api/drill/reviews/${encodeURIComponent(reviewId)}`, { method: 'DELETE' });
		} catch {
			return { kind: 'retry', message: 'No connection.', offline: true };
		}
		return (await classify(res)) ?? { kind: 'sent' };
	}
};
