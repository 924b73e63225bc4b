import { fail } from '@sveltejs/kit';
import {
	MAIL_CHOICE_NAMES,
	readUnsubscribeToken,
	unsubscribe
} from '$lib/server/digest/unsubscribe';
import type { Actions, PageServerLoad } from './$types';

/**
 * The page an unsubscribe link opens, signed in or not: it names the mail and turns it off with
 * one button (a mail scanner that fetches the link must not unsubscribe anyone), then offers to
 * turn it back on. The token in the address is the only credential.
 */
export const load: PageServerLoad = async ({ url }) => {
	const read = await readUnsubscribeToken(url.searchParams.get('token'));
	if (!read.ok) return { valid: false as const, message: read.message };
	return {
		valid: true as const,
		mail: MAIL_CHOICE_NAMES[read.kind],
		kind: read.kind,
		email: read.email,
		enabled: read.enabled
	};
};

async function setChoice(url: URL, enabled: boolean) {
	const result = await unsubscribe(url.searchParams.get('token'), enabled);
	if (!result.ok) return fail(400, { message: result.message });
	return { done: enabled ? ('resumed' as const) : ('stopped' as const) };
}

export const actions: Actions = {
	stop: ({ url }) => setChoice(url, false),
	resume: ({ url }) => setChoice(url, true)
};
