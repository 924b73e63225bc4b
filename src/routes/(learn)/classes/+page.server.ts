import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/guard';
import { decksAssignedTo } from '$lib/server/classes/assignments';
import { listClasses } from '$lib/server/classes/classes';
import { classLimits, readFields } from '$lib/server/classes/http';
import { emptyForm, readForm, refuseField, say, unreadable } from '$lib/server/forms';
import { joinCodeSchema } from '$lib/forms/classes';
import { joinByCode, leaveClass } from '$lib/server/classes/members';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const user = requireUser();
	const { items } = await listClasses(user);
	return {
		classes: items.filter((c) => c.as === 'learner'),
		decks: await decksAssignedTo(user.id),
		joined: url.searchParams.get('joined'),
		joinForm: await emptyForm(joinCodeSchema, 'join')
	};
};

export const actions: Actions = {
	join: async ({ request, setHeaders }) => {
		const user = requireUser();
		const form = await readForm(request, joinCodeSchema, 'join');
		if (!form) return unreadable(joinCodeSchema, 'join');
		const limit = await classLimits.join(user.id);
		if (!limit.allowed) {
			setHeaders({ 'Retry-After': String(limit.retryAfterSeconds) });
			return say(
				form,
				`Too many tries; wait ${Math.ceil(limit.retryAfterSeconds / 60)} minutes.`,
				429
			);
		}
		const result = await joinByCode(user, form.data.code);
		if (!result.ok) {
			// Every refusal is about the code typed (malformed, unknown, a closed class).
			const status = result.reason === 'invalid' ? 422 : result.reason === 'conflict' ? 409 : 404;
			return refuseField(form, 'code', result.message, status);
		}
		redirect(303, `/classes?joined=${encodeURIComponent(result.className)}`);
	},
	leave: async ({ request }) => {
		const user = requireUser();
		const form = await readFields(request);
		const result = await leaveClass(user, form?.classId);
		if (!result.ok) return fail(404, { message: result.message });
		return { left: true };
	}
};
