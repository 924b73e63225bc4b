import { fail, redirect } from '@sveltejs/kit';
import { signInUrl } from '$lib/server/auth/redirects';
import { acceptInvitation, previewInvitation } from '$lib/server/classes/invitations';
import { classForLink, joinByLink } from '$lib/server/classes/members';
import type { Actions, PageServerLoad } from './$types';

/**
 * Where an invite link (`/join?link=…`) or a mailed invitation (`/join?invitation=…`) lands.
 * Signed in: one button joins. Signed out: sign up (the invitation rides along) or sign in.
 */
export const load: PageServerLoad = async ({ url, locals }) => {
	const link = url.searchParams.get('link');
	const invitation = url.searchParams.get('invitation');
	const signedIn = locals.user !== null;
	if (invitation !== null) {
		const preview = await previewInvitation(invitation);
		return {
			kind: 'invitation' as const,
			found: preview !== null,
			className: preview?.className ?? null,
			teacherName: preview?.teacherName ?? null,
			status: preview?.status ?? null,
			signedIn,
			signUpHref: `/sign-up?invitation=${encodeURIComponent(invitation)}`,
			signInHref: signInUrl(url)
		};
	}
	const cls = link !== null ? await classForLink(link) : null;
	return {
		kind: 'link' as const,
		found: cls !== null,
		className: cls?.name ?? null,
		teacherName: cls?.teacherName ?? null,
		status: cls ? (cls.archived ? 'archived' : 'open') : null,
		signedIn,
		signUpHref: `/sign-up?next=${encodeURIComponent(url.pathname + url.search)}`,
		signInHref: signInUrl(url)
	};
};

export const actions: Actions = {
	default: async ({ url, locals }) => {
		if (!locals.user) redirect(303, signInUrl(url));
		const invitation = url.searchParams.get('invitation');
		const result =
			invitation !== null
				? await acceptInvitation(locals.user, invitation)
				: await joinByLink(locals.user, url.searchParams.get('link'));
		if (!result.ok)
			return fail(result.reason === 'conflict' ? 409 : 404, { message: result.message });
		redirect(303, `/classes?joined=${encodeURIComponent(result.className)}`);
	}
};
