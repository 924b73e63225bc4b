import { json } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/json';
import { getCard } from '$lib/server/study/cards';
import { studyRefusal } from '$lib/server/study/http';
import type { RequestHandler } from './$types';

/**
 * `GET /api/cards/[id]` → 200 `CardAnswer` (state and review history) for the card's learner or
 * a teacher of a class that learner is in; 404 for anyone else; 401 without a session.
 */
export const GET: RequestHandler = async ({ locals, params }) => {
	const user = locals.user;
	if (!user) return apiError(401, 'Sign in first.');
	try {
		return json(await getCard(user, params.id, new Date()), { status: 200 });
	} catch (error) {
		return studyRefusal(error);
	}
};
