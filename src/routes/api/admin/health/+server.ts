import { json } from '@sveltejs/kit';
import { refuseNonAdmin } from '$lib/server/admin/api';
import { checkHealth } from '$lib/server/admin/health';
import type { RequestHandler } from './$types';

/** `GET /api/admin/health`: 200 when every part answers, 503 (same body) when one does not. */
export const GET: RequestHandler = async ({ locals }) => {
	const refused = refuseNonAdmin(locals);
	if (refused) return refused;
	const health = await checkHealth();
	return json(health, { status: health.ok ? 200 : 503 });
};
