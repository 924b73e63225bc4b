import { error, redirect } from '@sveltejs/kit';
import { signInUrl } from '$lib/server/auth/redirects';
import { copyLick, findSharedLick } from '$lib/server/library/licks';
import { renderNote } from '$lib/library/markdown';
import type { Actions, PageServerLoad } from './$types';

/** A public lick's page: anyone may see and hear it; a signed-in person may copy it. */
export const load: PageServerLoad = async ({ params, locals }) => {
	const lick = await findSharedLick(params.slug);
	if (!lick)
		error(404, 'This share link leads nowhere: the lick was deleted or is no longer public.');
	return {
		lick: {
			title: lick.title,
			abc: lick.abc,
			tags: lick.tags,
			tempo: lick.tempo,
			feel: lick.feel,
			homeKey: lick.homeKey,
			homeQuality: lick.homeQuality,
			note: lick.note,
			versions: lick.versions,
			author: { name: lick.author.name },
			recording: lick.recording ? { type: lick.recording.type } : null,
			mine: locals.user?.id === lick.author.id
		},
		noteHtml: renderNote(lick.note),
		instrument: locals.user?.settings.instrument ?? 'concert'
	};
};

export const actions: Actions = {
	copy: async ({ params, locals, url }) => {
		if (!locals.user) redirect(303, signInUrl(url));
		const lick = await findSharedLick(params.slug);
		if (!lick) error(404, 'This share link leads nowhere.');
		const copy = await copyLick(locals.user, lick.id);
		redirect(303, `/library/${copy.id}`);
	}
};
