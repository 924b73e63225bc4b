import { json } from '@sveltejs/kit';
import { refusal, signInFirst } from '$lib/server/classes/http';
import { listMembers } from '$lib/server/classes/members';
import type { RequestHandler } from './$types';

/** `GET /api/classes/[id]/members` → `{items: [{userId, name, email, joinedAt}], total}` (its teacher). */
export const GET: RequestHandler = async ({ locals, params }) => {
	if (!locals.user) return signInFirst(null)!;
	const result = await listMembers(locals.user, params.id);
	return result.ok ? json({ items: result.items, total: result.total }) : refusal(result);
};
