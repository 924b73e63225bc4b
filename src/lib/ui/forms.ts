import type { SubmitFunction } from '@sveltejs/kit';

/**
 * A `use:enhance` callback that marks a form busy while it submits (so its button can say so
 * and refuse a second click) and keeps what the person typed when the server refuses it.
 * @example <form use:enhance={trackSubmitting((b) => (busy = b))}>
 */
export function trackSubmitting(setBusy: (busy: boolean) => void): SubmitFunction {
	return () => {
		setBusy(true);
		return async ({ update }) => {
			await update({ reset: false });
			setBusy(false);
		};
	};
}
