import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/json';
import { studyRefusal } from '$lib/server/study/http';
import { buildToday } from '$lib/server/study/today';
import type { RequestHandler } from './$types';

/**
 * `GET /api/drill/today` → 200 `TodayAnswer` (`$lib/practice/api`): the signed-in learner's
 * queue with every prompt rendered; 401 without a session.
 */
export const GET: RequestHandler = async ({ locals }) => {
	const user = locals.user;
	if (!user) return apiError(401, 'Sign in first.');
	try {
		return json(await buildToday(user, new Date()), {
			status: 200,
			headers: { 'cache-control': 'no-store' }
		});
	} catch (error) {
		return studyRefusal(error);
	}
};
