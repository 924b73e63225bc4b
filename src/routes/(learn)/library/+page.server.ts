import { error, fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/guard';
import { readLickQuery } from '$lib/server/library/api';
import { listDecks } from '$lib/server/library/decks';
import { LibraryError } from '$lib/server/library/errors';
import { addDemoLicks } from '$lib/server/library/demo';
import { listLicks } from '$lib/server/library/licks';
import type { Actions, PageServerLoad } from './$types';

/** Licks a page of the table shows. */
const PAGE_SIZE = 25;

export const load: PageServerLoad = async ({ url }) => {
	const user = requireUser();
	let query;
	try {
		query = readLickQuery(url);
	} catch (e) {
		if (e instanceof LibraryError) error(400, e.message);
		throw e;
	}
	const page = Math.max(1, Number(url.searchParams.get('page')) || 1);
	const limit = PAGE_SIZE;
	const offset = (page - 1) * limit;
	const [licks, decks, anything] = await Promise.all([
		listLicks(user, { ...query, limit, offset }),
		listDecks(user, { limit: 100 }),
		listLicks(user, { scope: query.scope, limit: 1 })
	]);
	return {
		licks,
		decks: decks.items.map((d) => ({ id: d.id, name: d.name })),
		filters: {
			q: query.q ?? '',
			quality: query.quality ?? '',
			key: query.key ?? '',
			deck: query.deckId ?? '',
			scope: query.scope ?? 'mine',
			sort: query.sort ?? '-updated'
		},
		page,
		pageSize: limit,
		/** False when the scope holds no lick at all (not just none matching the filters). */
		hasAny: anything.total > 0
	};
};

export const actions: Actions = {
	/** Copy our demo licks into an empty library, so there is something to practise on. */
	demo: async () => {
		const user = requireUser();
		const made = await addDemoLicks(user);
		if (made === 0) return fail(409, { message: 'The demo licks are in your library already.' });
		redirect(303, '/library');
	}
};
