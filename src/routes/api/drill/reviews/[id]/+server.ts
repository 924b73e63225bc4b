import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/json';
import { studyRefusal } from '$lib/server/study/http';
import { undoReview } from '$lib/server/study/reviews';
import type { RequestHandler } from './$types';

/**
 * `DELETE /api/drill/reviews/[id]` → 200 `ReviewAnswer`: the review is undone and its card is
 * exactly as before it; 404 not the learner's review; 409 the card was graded again since;
 * 401 without a session.
 */
export const DELETE: RequestHandler = async ({ locals, params }) => {
	const user = locals.user;
	if (!user) return apiError(401, 'Sign in first.');
	try {
		return json(await undoReview(user, params.id, new Date()), { status: 200 });
	} catch (error) {
		return studyRefusal(error);
	}
};
