import { error, fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/guard';
import { listComments, postComment } from '$lib/server/classes/comments';
import { learnerDetail } from '$lib/server/classes/learner';
import { readFields } from '$lib/server/classes/http';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const user = requireRole('teacher', 'admin');
	const result = await learnerDetail(user, params.id, params.userId);
	if (!result.ok) error(404, result.message);
	const { view } = result;
	const selected = view.rows.find((r) => r.cardId === url.searchParams.get('card')) ?? null;
	const thread = selected ? await listComments(user, selected.cardId) : null;
	return {
		classId: params.id,
		view,
		selected: selected ? { cardId: selected.cardId, title: selected.title } : null,
		thread: thread?.ok ? thread.items : []
	};
};

export const actions: Actions = {
	comment: async ({ request }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readFields(request);
		const result = await postComment(user, form?.cardId, { text: form?.text });
		if (!result.ok) {
			return fail(result.reason === 'invalid' ? 422 : 404, {
				text: form?.text ?? '',
				message: result.message
			});
		}
		return { done: true };
	}
};
