import { requireRole } from '$lib/server/auth/guard';
import { getMailStatus } from '$lib/server/mail/index';
import { countMessages, listMessages } from '$lib/server/mail/outbox';
import type { PageServerLoad } from './$types';

const SHOWN = 200;

export const load: PageServerLoad = async () => {
	requireRole('admin');
	const [messages, total] = await Promise.all([listMessages({ limit: SHOWN }), countMessages()]);
	return { messages, total, mail: getMailStatus() };
};
