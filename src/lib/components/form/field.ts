/**
 * What every field component shares: ids of its hint and error, and the `aria-describedby` that
 * reads the error first, then the hint. Plain functions, so the field components stay small.
 */

/** Ids of a field's parts, from the input's id. */
export function fieldIds(inputId: string) {
	return { hint: `${inputId}-hint`, error: `${inputId}-error` };
}

/**
 * The ids a field's description is made of, or undefined when it has none.
 * @example describedBy('email', true, false) // → 'email-error'
 */
export function describedBy(inputId: string, hasError: boolean, hasHint: boolean) {
	const ids = fieldIds(inputId);
	return (
		[hasError ? ids.error : null, hasHint ? ids.hint : null].filter(Boolean).join(' ') || undefined
	);
}

/** The message shown under a field: the first of its errors. */
export function firstError(errors: string[] | undefined): string | null {
	return errors && errors.length > 0 ? errors[0] : null;
}

/** Classes of a field's label, hint and error text (one look for every form). */
export const LABEL_CLASS = 'font-bold text-ink-900 dark:text-paper-100';
export const HINT_CLASS = 'text-sm text-ink-700 dark:text-paper-200';
export const ERROR_CLASS = 'text-sm font-bold text-rose-600 dark:text-rose-300';
