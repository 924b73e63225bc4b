import { json } from '@sveltejs/kit';
import { readJsonBody, tooManyRequests } from '$lib/server/http/json';
import { libraryCheckLimiter, MAX_LICK_BODY_BYTES, withActor } from '$lib/server/library/api';
import { checkDraft } from '$lib/server/library/check';
import type { RequestHandler } from './$types';

/**
 * `POST /api/licks/check` `{abc, versions?, quality?, instrument?}` → 200 `{home, variants,
 * suggestedTags}`: the editor's check of unsaved abc with its twelve-key grid. 422 with `line`,
 * `column` (and `version`) for invalid abc; 429 past 120 a minute; 401 signed out.
 */
export const POST: RequestHandler = ({ locals, request }) =>
	withActor(locals, async (actor) => {
		const limit = await libraryCheckLimiter().consume(actor.id);
		if (!limit.allowed) return tooManyRequests(limit.retryAfterSeconds, 'checks');
		const body = await readJsonBody(request, MAX_LICK_BODY_BYTES);
		if (!body.ok) return body.response;
		return json(await checkDraft(body.value), { status: 200 });
	});
