import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/guard';
import { readMessage } from '$lib/server/mail/outbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	requireRole('admin');
	const result = await readMessage(params.id);
	if (!result.ok) error(404, result.error);
	return { message: result.message };
};
