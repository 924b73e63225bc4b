import { json } from '@sveltejs/kit';
import { refusal, signInFirst } from '$lib/server/classes/http';
import { learnerDetail } from '$lib/server/classes/learner';
import type { RequestHandler } from './$types';

/**
 * `GET /api/classes/[id]/learners/[userId]` (the class's teacher, a member) → `{learner,
 * className, keys, rows, log}`: the lick-by-key heat map, tempo per lick and practice log.
 */
export const GET: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return signInFirst(null)!;
	const result = await learnerDetail(locals.user, params.id, params.userId);
	return result.ok ? json(result.view) : refusal(result);
};
