import { error, fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireUser } from '$lib/server/auth/guard';
import { deleteDeck, getDeck, updateDeck } from '$lib/server/library/decks';
import { LibraryError } from '$lib/server/library/errors';
import { listLicks } from '$lib/server/library/licks';
import { deckSchema } from '$lib/library/forms';
import type { Actions, PageServerLoad } from './$types';

const orError = async <T>(run: () => Promise<T>): Promise<T> => {
	try {
		return await run();
	} catch (e) {
		if (e instanceof LibraryError) error(e.status, e.message);
		throw e;
	}
};

export const load: PageServerLoad = async ({ params, url }) => {
	const user = requireUser();
	const deck = await orError(() => getDeck(user, params.id));
	const find = url.searchParams.get('find') ?? '';
	// Licks to add: anything the owner may read, searched by title or tag.
	const candidates = deck.mine
		? await listLicks(user, { scope: 'all', q: find, limit: 20, sort: 'title' })
		: { items: [], total: 0 };
	const inDeck = new Set(deck.licks.map((l) => l.id));
	return {
		deck,
		find,
		candidates: candidates.items
			.filter((l) => !inDeck.has(l.id))
			.map((l) => ({ id: l.id, title: l.title, author: l.mine ? null : l.author.name })),
		form: await superValidate({ name: deck.name, description: deck.description }, zod4(deckSchema))
	};
};

export const actions: Actions = {
	rename: async ({ request, params }) => {
		const user = requireUser();
		const form = await superValidate(request, zod4(deckSchema));
		if (!form.valid) return fail(422, { form });
		await orError(() => updateDeck(user, params.id, form.data));
		return message(form, 'Saved.');
	},
	delete: async ({ params }) => {
		const user = requireUser();
		try {
			await deleteDeck(user, params.id);
		} catch (e) {
			if (e instanceof LibraryError && e.status === 409)
				return fail(409, { deleteError: e.message });
			if (e instanceof LibraryError) error(e.status, e.message);
			throw e;
		}
		redirect(303, '/library/decks');
	}
};
