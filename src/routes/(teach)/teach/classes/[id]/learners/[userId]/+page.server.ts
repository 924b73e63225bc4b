import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth/guard';
import { listComments, postComment } from '$lib/server/classes/comments';
import { learnerDetail } from '$lib/server/classes/learner';
import { refuseForm } from '$lib/server/classes/http';
import { emptyForm, readForm, unreadable } from '$lib/server/forms';
import { commentSchema } from '$lib/forms/classes';
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
		thread: thread?.ok ? thread.items : [],
		commentForm: await emptyForm(commentSchema)
	};
};

export const actions: Actions = {
	comment: async ({ request }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readForm(request, commentSchema);
		if (!form) return unreadable(commentSchema);
		const result = await postComment(user, form.data.cardId, { text: form.data.text });
		if (!result.ok) return refuseForm(form, result);
		// The thread above shows the comment; the emptied field says it went.
		return { form };
	}
};
