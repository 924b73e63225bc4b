import { redirect } from '@sveltejs/kit';
import { apiError } from '$lib/server/http/json';
import { unsubscribe } from '$lib/server/digest/unsubscribe';
import type { RequestHandler } from './$types';

/**
 * The address in every scheduled mail's `List-Unsubscribe` header. A mail client's one-click
 * unsubscribe (RFC 8058) POSTs `List-Unsubscribe=One-Click` here as a form, with no cookie and
 * usually no Origin: the signed token in the address is the credential, which is why this one
 * path is exempt from the cross-site form check (`handleCrossSiteForms` in hooks.server.ts).
 * Success answers 204 with no page; a person who opens the address gets the page instead.
 */

const MAX_BODY_BYTES = 4 * 1024;

export const POST: RequestHandler = async ({ request, url }) => {
	const type = (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
	if (type !== 'application/x-www-form-urlencoded' && type !== 'multipart/form-data') {
		return apiError(
			415,
			'Send the one-click unsubscribe as a form (application/x-www-form-urlencoded or multipart/form-data).'
		);
	}
	if (Number(request.headers.get('content-length') ?? 0) > MAX_BODY_BYTES) {
		return apiError(
			413,
			`A one-click unsubscribe is one field; this body is over ${MAX_BODY_BYTES} bytes.`
		);
	}
	let form: FormData;
	try {
		form = await request.formData();
	} catch {
		return apiError(400, 'The form body could not be read.');
	}
	if (form.get('List-Unsubscribe') !== 'One-Click') {
		return apiError(400, 'The body must be List-Unsubscribe=One-Click (RFC 8058).', {
			field: 'List-Unsubscribe'
		});
	}
	const result = await unsubscribe(url.searchParams.get('token'));
	if (!result.ok) return apiError(400, result.message, { field: 'token' });
	return new Response(null, { status: 204 });
};

/** Someone opened the header's address in a browser: show them the page with its button. */
export const GET: RequestHandler = ({ url }) => {
	redirect(303, `/unsubscribe?token=${encodeURIComponent(url.searchParams.get('token') ?? '')}`);
};
