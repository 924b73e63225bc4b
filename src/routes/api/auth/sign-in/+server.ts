import { json } from '@sveltejs/kit';
import { signIn } from '$lib/server/auth/accounts';
import { apiError, readJsonObject, tooManyRequests } from '$lib/server/http/json';
import { limitSignIn } from '$lib/server/auth/limits';
import { startSession } from '$lib/server/auth/session';
import type { RequestHandler } from './$types';

/**
 * `POST /api/auth/sign-in` `{ email, password }` → 200 `{ user }` with the session cookie;
 * 401 wrong e-mail or password, 422 missing field, 400 bad JSON, 429 with Retry-After when this
 * address (or this address for this e-mail) has had too many failures.
 */
export const POST: RequestHandler = async ({ request, cookies, getClientAddress }) => {
	const body = await readJsonObject(request);
	if (!body.ok) return body.response;
	const address = getClientAddress();
	const { email, password } = body.value;
	const tried = await limitSignIn(address, email, () => signIn({ email, password }));
	if (tried.limited) return tooManyRequests(tried.retryAfterSeconds);
	const result = tried.result;
	if (!result.ok) {
		if (result.reason === 'invalid') {
			return apiError(422, result.message, { field: result.field });
		}
		return apiError(401, result.message);
	}
	await startSession(cookies, result.user.id);
	const { id, name, role, emailVerified } = result.user;
	return json(
		{ user: { id, name, email: result.user.email, role, emailVerified } },
		{ status: 200 }
	);
};
