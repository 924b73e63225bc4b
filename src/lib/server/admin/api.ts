import { json } from '@sveltejs/kit';

/**
 * The admin JSON endpoints check the session themselves rather than trusting the route-group
 * gate: 401 without a session, 403 for any role but admin.
 * @example const refused = refuseNonAdmin(locals); if (refused) return refused;
 */
export function refuseNonAdmin(locals: App.Locals): Response | null {
	if (!locals.user)
		return json({ message: 'Sign in as an admin to use this endpoint.' }, { status: 401 });
	if (locals.user.role !== 'admin') {
		return json({ message: 'This endpoint is for admin accounts.' }, { status: 403 });
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
			response: json(
				{ message: `limit ${JSON.stringify(raw)} must be a whole number from 1 to ${max}.` },
				{ status: 400 }
			)
		};
	}
	return { ok: true, value };
}
