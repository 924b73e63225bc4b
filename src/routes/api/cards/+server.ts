import { json } from '@sveltejs/kit';
import { apiError, readJsonObject } from '$lib/server/http/json';
import { addCards, type AddCardsInput } from '$lib/server/study/cards';
import { studyRefusal } from '$lib/server/study/http';
import type { RequestHandler } from './$types';

/**
 * `POST /api/cards` `{lickId, qualities?}` or `{deckId}` → 201 `{created, existing, cardIds}`:
 * the lick over its home quality and the chosen ones, or every lick of the deck, added to the
 * signed-in learner's drill (cards already there are kept as they are); 404 a lick or deck they
 * may not use; 422 an unknown quality; 400 anything else malformed; 401 without a session.
 */
export const POST: RequestHandler = async ({ locals, request }) => {
	const user = locals.user;
	if (!user) return apiError(401, 'Sign in first.');
	const body = await readJsonObject(request, 4 * 1024);
	if (!body.ok) return body.response;
	const input = readAddCards(body.value);
	if ('message' in input) return apiError(400, input.message);
	try {
		return json(await addCards(user, input, new Date()), { status: 201 });
	} catch (error) {
		return studyRefusal(error);
	}
};

function readAddCards(v: Record<string, unknown>): AddCardsInput | { message: string } {
	const keys = Object.keys(v).sort().join(',');
	if (keys === 'deckId' && typeof v.deckId === 'string') return { deckId: v.deckId };
	if ((keys === 'lickId' || keys === 'lickId,qualities') && typeof v.lickId === 'string') {
		if (v.qualities === undefined) return { lickId: v.lickId };
		if (
			Array.isArray(v.qualities) &&
			v.qualities.length <= 12 &&
			v.qualities.every((q) => typeof q === 'string')
		) {
			return { lickId: v.lickId, qualities: v.qualities as string[] };
		}
		return { message: '“qualities” must be a list of chord qualities such as ["m7", "maj7"].' };
	}
	return { message: 'Send {"lickId": "…", "qualities": […]} or {"deckId": "…"}.' };
}
