import { apiError } from '../http/json';

/**
 * The admin JSON endpoints' refusal, 401 without a session and 403 for any role but admin. The
 * role hook answers with it for every `/api/admin` route, and each endpoint asks again itself
 * rather than trusting that the hook ran.
 * @example const refused = refuseNonAdmin(locals); if (refused) return refused;
 */
export function refuseNonAdmin(locals: App.Locals): Response | null {
	if (!locals.user) return apiError(401, 'Sign in first.');
	if (locals.user.role !== 'admin') {
		return apiError(403, 'This endpoint is for admin accounts.');
	}
	return null;
}

/**
 * A whole-number query parameter within bounds, or a 400 answer naming the bad value.
 * @example readLimit(new URL('http://x/?limit=5'), 200) // { ok: true, value: 5 }
 */
export function readLimit(
	url: URL,
	fallback: number,
	max = 1000
): { ok: true; value: number } | { ok: false; response: Response } {
	const raw = url.searchParams.get('limit');
	if (raw === null) return { ok: true, value: fallback };
	const value = Number(raw);
	if (!/^\d+$/.test(raw) || value < 1 || value > max) {
		return {
			ok: false,
			response: apiError(
				400,
				`limit ${JSON.stringify(raw)} must be a whole number from 1 to ${max}.`
			)
		};
	}
	return { ok: true, value };
}
