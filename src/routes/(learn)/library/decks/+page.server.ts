import { fail, redirect } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireUser } from '$lib/server/auth/guard';
import { createDeck, listDecks } from '$lib/server/library/decks';
import { deckSchema } from '$lib/library/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireUser();
	const decks = await listDecks(user, { limit: 100 });
	return { decks, form: await superValidate(zod4(deckSchema)) };
};

export const actions: Actions = {
	create: async ({ request }) => {
		const user = requireUser();
		const form = await superValidate(request, zod4(deckSchema));
		if (!form.valid) return fail(422, { form });
		const deck = await createDeck(user, {
			name: form.data.name,
			description: form.data.description
		});
		redirect(303, `/library/decks/${deck.id}`);
	}
};
