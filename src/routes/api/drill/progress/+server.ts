import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/json';
import { studyRefusal } from '$lib/server/study/http';
import { buildProgress } from '$lib/server/study/progress';
import type { RequestHandler } from './$types';

/**
 * `GET /api/drill/progress` → 200 `ProgressAnswer` (`$lib/practice/api`): the signed-in
 * learner's streak, calendar, reviews per day, retention by maturity, key strengths, tempos and
 * 14-day forecast; 401 without a session.
 */
export const GET: RequestHandler = async ({ locals }) => {
	const user = locals.user;
	if (!user) return apiError(401, 'Sign in first.');
	try {
		return json(await buildProgress(user, new Date()), {
			status: 200,
			headers: { 'cache-control': 'no-store' }
		});
	} catch (error) {
		return studyRefusal(error);
	}
};
