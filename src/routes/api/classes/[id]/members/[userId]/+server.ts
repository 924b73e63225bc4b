import { json } from '@sveltejs/kit';
import { refusal, signInFirst } from '$lib/server/classes/http';
import { removeMember } from '$lib/server/classes/members';
import type { RequestHandler } from './$types';

/**
 * `DELETE /api/classes/[id]/members/[userId]`: the teacher removes a member, or a learner leaves
 * (their own id) → `{retired}`, the number of not-yet-introduced cards retired; history stays.
 */
export const DELETE: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return signInFirst(null)!;
	const result = await removeMember(locals.user, params.id, params.userId);
	return result.ok ? json({ retired: result.retired }) : refusal(result);
};
