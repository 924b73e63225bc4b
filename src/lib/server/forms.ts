import { fail, type ActionFailure } from '@sveltejs/kit';
import { message, superValidate, type SuperValidated } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { z } from 'zod';

/**
 * The server half of every form: read the body, check it against the form's schema (the one its
 * page uses too), answer refusals in one shape. See DEVELOPERS.md "Building a form".
 */

type Schema = z.ZodType<Record<string, unknown>>;
type Data<S extends Schema> = Extract<z.output<S>, Record<string, unknown>>;
/** A form checked against schema `S`, as superforms hands it to the page. */
export type Form<S extends Schema> = SuperValidated<
	Data<S>,
	string,
	Extract<z.input<S>, Record<string, unknown>>
>;

/** What a form's data is before anything was typed: for a page load. */
export function emptyForm<S extends Schema>(schema: S, id?: string): Promise<Form<S>> {
	return superValidate(zod4(schema as never), { id }) as Promise<Form<S>>;
}

/** A form filled from stored values (the settings a learner keeps): for a page load. */
export function filledForm<S extends Schema>(
	schema: S,
	data: Partial<Record<keyof Data<S>, unknown>>,
	id?: string
): Promise<Form<S>> {
	return superValidate(data as never, zod4(schema as never), { id, errors: false }) as Promise<
		Form<S>
	>;
}

/**
 * The posted form checked against its schema, or null when the body is not a form at all (a
 * JSON body, a multipart body without its boundary): answer that with `unreadable`.
 *
 * @example const form = await readForm(request, signInSchema); if (!form) return unreadable(signInSchema);
 */
export async function readForm<S extends Schema>(
	request: Request,
	schema: S,
	id?: string
): Promise<Form<S> | null> {
	let data: FormData;
	try {
		data = await request.formData();
	} catch {
		return null;
	}
	return superValidate(data, zod4(schema as never), { id }) as Promise<Form<S>>;
}

/** The 400 answer to a body that is not a form; nothing in it was read. */
export async function unreadable<S extends Schema>(
	schema: S,
	id?: string
): Promise<ActionFailure<{ form: Form<S> }>> {
	const empty = await emptyForm(schema, id);
	return message(empty as never, 'The form could not be read.', { status: 400 }) as never;
}

/** Refuse a form whose fields did not pass: 422 with every field's message and what was typed. */
export function refuse<S extends Schema>(form: Form<S>, ...secret: (keyof Data<S>)[]) {
	return fail(422, { form: withoutSecrets(form, secret) });
}

/**
 * Send a form back with a sentence about it as a whole (not one field), and a status.
 * @example return say(form, 'Too many tries.', 429, 'password')
 */
export function say<S extends Schema>(
	form: Form<S>,
	text: string,
	status: 400 | 403 | 404 | 409 | 422 | 429 | 503,
	...secret: (keyof Data<S>)[]
): ActionFailure<{ form: Form<S> }> {
	return message(withoutSecrets(form, secret) as never, text, { status }) as never;
}

/**
 * Put a message beside one field and send the form back.
 * @example return refuseField(form, 'email', 'An account with this e-mail address already exists.', 409, 'password')
 */
export function refuseField<S extends Schema>(
	form: Form<S>,
	/** A field of the form; a service's field name outside it lands on the form as a whole. */
	field: string,
	text: string,
	status: 400 | 404 | 409 | 422 = 422,
	...secret: (keyof Data<S>)[]
) {
	if (!(field in form.data)) return say(form, text, status, ...secret);
	form.valid = false;
	// A list field (ticked boxes) keeps its own errors under `_errors`, as superforms reads them.
	(form.errors as Record<string, unknown>)[field] = Array.isArray(form.data[field])
		? { _errors: [text] }
		: [text];
	return fail(status, { form: withoutSecrets(form, secret) });
}

/** Passwords never travel back to the page, not even the one just typed. */
function withoutSecrets<S extends Schema>(form: Form<S>, secret: (keyof Data<S>)[]): Form<S> {
	for (const key of secret) (form.data as Record<string, unknown>)[key as string] = '';
	return form;
}
