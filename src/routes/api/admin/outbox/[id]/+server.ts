import { json } from '@sveltejs/kit';
import { refuseNonAdmin } from '$lib/server/admin/api';
import { apiError } from '$lib/server/http/json';
import { readMessage } from '$lib/server/mail/outbox';
import type { RequestHandler } from './$types';

/** `GET /api/admin/outbox/:id`: one message (headers, both parts, links) or 404. */
export const GET: RequestHandler = async ({ locals, params }) => {
	const refused = refuseNonAdmin(locals);
	if (refused) return refused;
	const result = await readMessage(params.id);
	if (!result.ok) return apiError(404, result.error);
	return json(result.message, { status: 200 });
};
