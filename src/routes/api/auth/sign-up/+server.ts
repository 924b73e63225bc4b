import { json } from '@sveltejs/kit';
import { normalizeEmail, signUp } from '$lib/server/auth/accounts';
import { apiError, readJsonObject, tooManyRequests } from '$lib/server/http/json';
import { consumeSignUp } from '$lib/server/auth/limits';
import type { RequestHandler } from './$types';

/**
 * `POST /api/auth/sign-up` `{ email, password, name, role }` → 201 `{ user, mailSent }` and the
 * verification mail; 409 address taken, 422 invalid field, 400 bad JSON, 429 limited.
 * It does not sign in: the client calls /api/auth/sign-in next.
 */
export const POST: RequestHandler = async ({ request, getClientAddress }) => {
	const body = await readJsonObject(request);
	if (!body.ok) return body.response;
	// Refused before the limiter: a missing or malformed address would otherwise count against
	// one shared per-e-mail bucket (the empty one), which a stranger could fill for everyone.
	if (!normalizeEmail(body.value.email)) {
		return apiError(422, 'Enter an e-mail address such as name@example.com.', { field: 'email' });
	}
	const limit = await consumeSignUp(getClientAddress(), body.value.email);
	if (!limit.allowed) return tooManyRequests(limit.retryAfterSeconds);

	const result = await signUp(body.value);
	if (!result.ok) {
		const status = result.reason === 'email-taken' ? 409 : 422;
		return apiError(status, result.message, { field: result.field });
	}
	const { id, name, email, role, emailVerified } = result.user;
	return json(
		{ user: { id, name, email, role, emailVerified }, mailSent: result.mailSent },
		{ status: 201 }
	);
};
