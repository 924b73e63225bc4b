import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/guard';
import { decksAssignedTo } from '$lib/server/classes/assignments';
import { listClasses } from '$lib/server/classes/classes';
import { classLimits, readFields } from '$lib/server/classes/http';
import { joinByCode, leaveClass } from '$lib/server/classes/members';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const user = requireUser();
	const { items } = await listClasses(user);
	return {
		classes: items.filter((c) => c.as === 'learner'),
		decks: await decksAssignedTo(user.id),
		joined: url.searchParams.get('joined')
	};
};

export const actions: Actions = {
	join: async ({ request, setHeaders }) => {
		const user = requireUser();
		const form = await readFields(request);
		const limit = await classLimits.join(user.id);
		if (!limit.allowed) {
			setHeaders({ 'Retry-After': String(limit.retryAfterSeconds) });
			return fail(429, {
				code: form?.code ?? '',
				message: `Too many tries; wait ${Math.ceil(limit.retryAfterSeconds / 60)} minutes.`
			});
		}
		const result = await joinByCode(user, form?.code);
		if (!result.ok) {
			const status = result.reason === 'invalid' ? 422 : result.reason === 'conflict' ? 409 : 404;
			return fail(status, { code: form?.code ?? '', message: result.message });
		}
		redirect(303, `/classes?joined=${encodeURIComponent(result.className)}`);
	},
	leave: async ({ request }) => {
		const user = requireUser();
		const form = await readFields(request);
		const result = await leaveClass(user, form?.classId);
		if (!result.ok) return fail(404, { code: '', message: result.message });
		return { left: true };
	}
};
