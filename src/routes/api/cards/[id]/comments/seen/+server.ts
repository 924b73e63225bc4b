import { markCommentsSeen } from '$lib/server/classes/comments';
import { apiError } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/**
 * `POST /api/cards/[id]/comments/seen` → 204: the teacher's comments on the signed-in learner's
 * card are marked seen (the drill sends it at the reveal, where the thread is shown); 404 a card
 * that is not theirs; 401 without a session.
 */
export const POST: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return apiError(401, 'Sign in first.');
	const { cards } = await markCommentsSeen(locals.user.id, [params.id]);
	if (cards === 0) return apiError(404, 'No such card among yours.');
	return new Response(null, { status: 204 });
};
