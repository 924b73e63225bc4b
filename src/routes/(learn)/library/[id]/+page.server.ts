import { error, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/guard';
import { LibraryError } from '$lib/server/library/errors';
import { checkLickAbc, copyLick, getLick } from '$lib/server/library/licks';
import { renderNote } from '$lib/library/markdown';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const user = requireUser();
	try {
		const lick = await getLick(user, params.id);
		return {
			lick,
			abcHome: abcHomeOf(lick),
			noteHtml: renderNote(lick.note),
			instrument: user.settings.instrument ?? 'concert'
		};
	} catch (e) {
		if (e instanceof LibraryError) error(e.status, e.message);
		throw e;
	}
};

/** What the stored abc reads as home key and quality (the editor tells an override from it). */
function abcHomeOf(lick: { abc: string; versions: Record<string, string> }) {
	try {
		const read = checkLickAbc(lick.abc, lick.versions);
		return { key: read.homeKey, quality: read.homeQuality };
	} catch {
		// A stored lick always reads; should one not, every home value shows as chosen.
		return null;
	}
}

export const actions: Actions = {
	/** A private copy of a lick shared with the actor, to change as their own. */
	copy: async ({ params }) => {
		const user = requireUser();
		let id: string;
		try {
			id = (await copyLick(user, params.id)).id;
		} catch (e) {
			if (e instanceof LibraryError) error(e.status, e.message);
			throw e;
		}
		redirect(303, `/library/${id}`);
	}
};
