import type { z } from 'zod';

/** The first problem of a failed parse: its top-level field and message. */
export interface FirstIssue<F extends string> {
	field: F;
	message: string;
}

/**
 * Check loose input (JSON, or a form read as text) against a form's schema and give the typed
 * value or the first problem, in the schema's field order. What services use, so an API caller
 * gets the same rules and sentences as the form.
 * @example parseFirst(forgotPasswordSchema, { email: 'x' }) // → { ok: false, field: 'email', message: 'Enter an e-mail address such as name@example.com.' }
 */
export function parseFirst<S extends z.ZodType<Record<string, unknown>>>(
	schema: S,
	input: unknown
):
	| { ok: true; value: z.infer<S> }
	| ({ ok: false } & FirstIssue<Extract<keyof z.infer<S>, string>>) {
	const value = input && typeof input === 'object' && !Array.isArray(input) ? input : {};
	const result = schema.safeParse(value);
	if (result.success) return { ok: true, value: result.data };
	const issue = result.error.issues[0];
	return {
		ok: false,
		field: String(issue.path[0] ?? '') as Extract<keyof z.infer<S>, string>,
		message: issue.message
	};
}
