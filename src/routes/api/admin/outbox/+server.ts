import { json } from '@sveltejs/kit';
import { readLimit, refuseNonAdmin } from '$lib/server/admin/api';
import { countMessages, listMessages } from '$lib/server/mail/outbox';
import type { RequestHandler } from './$types';

/** `GET /api/admin/outbox?limit=N`: stored messages, newest first, and how many there are. */
export const GET: RequestHandler = async ({ locals, url }) => {
	const refused = refuseNonAdmin(locals);
	if (refused) return refused;
	const limit = readLimit(url, 200);
	if (!limit.ok) return limit.response;
	const [messages, total] = await Promise.all([
		listMessages({ limit: limit.value }),
		countMessages()
	]);
	return json({ total, messages }, { status: 200 });
};
