import type { z } from 'zod';
import { apiError } from '../http/json';
import { createRateLimiter } from '../auth/rate-limit';
import type { SessionUser } from '../auth/session';
import { refuseField, say, type Form } from '../forms';
import type { Refusal } from './common';

/** The class services' refusals as the API's answers: one status per reason. */
export function refusal(result: Refusal): Response {
	switch (result.reason) {
		case 'not-found':
			return apiError(404, result.message);
		case 'forbidden':
			return apiError(403, result.message);
		case 'conflict':
			return apiError(409, result.message);
		case 'invalid':
			return apiError(422, result.message, { field: result.field });
	}
}

/** 401 for a request without a session (every class endpoint checks this itself). */
export function signInFirst(user: SessionUser | null): Response | null {
	return user ? null : apiError(401, 'Sign in first.');
}

// Invitations send mail, and join codes are short enough to guess at: both are limited per user,
// in the database so that the limits hold across processes.
const invitationLimiter = createRateLimiter('class-invite', { max: 30, windowMs: 60 * 60 * 1000 });
const joinLimiter = createRateLimiter('class-join', { max: 20, windowMs: 15 * 60 * 1000 });

export const classLimits = {
	/** 30 invitation mails an hour per teacher. */
	invite: (userId: string) => invitationLimiter.consume(userId),
	/** 20 join tries per 15 minutes per user. */
	join: (userId: string) => joinLimiter.consume(userId)
};

/**
 * A class service's refusal sent back with the form it came from: beside the field it names, or
 * about the form as a whole (not found, forbidden, a state that forbids it).
 * @example if (!result.ok) return refuseForm(form, result);
 */
export function refuseForm<S extends z.ZodType<Record<string, unknown>>>(
	form: Form<S>,
	result: Refusal
) {
	if (result.reason === 'invalid') return refuseField(form, result.field, result.message);
	const status = { 'not-found': 404, forbidden: 403, conflict: 409 } as const;
	return say(form, result.message, status[result.reason]);
}

/**
 * A submitted form's text fields (first value of each), or null when the body is not a form.
 * The class forms post plain actions whose fields the class services check themselves.
 */
export async function readFields(request: Request): Promise<Record<string, string> | null> {
	let data: FormData;
	try {
		data = await request.formData();
	} catch {
		return null;
	}
	const fields: Record<string, string> = {};
	for (const [name, value] of data) {
		if (typeof value === 'string' && !(name in fields)) fields[name] = value;
	}
	return fields;
}
