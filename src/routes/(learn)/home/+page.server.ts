import { requireRole } from '$lib/server/auth/guard';
import { listAddable } from '$lib/server/study/addable';
import type { TodayAnswer } from '$lib/practice/api';
import type { PageServerLoad } from './$types';

// Teachers and admins may drill too; the hook has already turned away anonymous visitors.
export const load: PageServerLoad = async ({ fetch }) => {
	const user = requireRole('learner', 'teacher', 'admin');
	// Today's counts come from the drill's own answer, so this page and the drill always agree.
	const res = await fetch('/api/drill/today');
	const today = res.ok ? ((await res.json()) as TodayAnswer) : null;
	return {
		firstName: user.name.trim().split(/\s+/)[0] || user.name,
		today: today && {
			day: today.day,
			counts: today.counts,
			backlog: today.backlog,
			prompts: today.items.length,
			keys: [...new Set(today.items.map((i) => i.key))]
		},
		addable: await listAddable(user)
	};
};
