import { json } from '@sveltejs/kit';
import { apiError, readJsonObject } from '$lib/server/http/json';
import { studyRefusal } from '$lib/server/study/http';
import { readReviewInput, recordReview } from '$lib/server/study/reviews';
import type { RequestHandler } from './$types';

/**
 * `POST /api/drill/reviews` `{cardId, key, quality, grade, tempo?, revealMs?, gradeMs?, clientId,
 * reviewedAt?, sittingId?}` → 201 `ReviewAnswer`; 200 and the same answer when that clientId was
 * recorded already; 404 a card that is not the learner's; 409 a card changing under too many
 * concurrent grades; 400/415/413/422 bad input; 401 without a session.
 */
export const POST: RequestHandler = async ({ locals, request }) => {
	const user = locals.user;
	if (!user) return apiError(401, 'Sign in first.');
	const body = await readJsonObject(request, 4 * 1024);
	if (!body.ok) return body.response;
	const now = new Date();
	const input = readReviewInput(body.value, now);
	if (!input.ok) return apiError(input.status, input.message, { field: input.field });
	try {
		const { status, answer } = await recordReview(user, input.value, now);
		return json(answer, { status });
	} catch (error) {
		return studyRefusal(error);
	}
};
