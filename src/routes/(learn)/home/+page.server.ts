import { requireRole } from '$lib/server/auth/guard';
import { checkHealth } from '$lib/server/admin/health';
import { countUsersByRole } from '$lib/server/admin/users';
import { listClasses } from '$lib/server/classes/classes';
import { listAddable } from '$lib/server/study/addable';
import type { TodayAnswer } from '$lib/practice/api';
import type { PageServerLoad } from './$types';

/**
 * "Today" for each role. A learner's day is their drill. A teacher's is their classes first,
 * then their own practice; an admin's is the site (accounts, mail, database) first. Teachers and
 * admins may drill too, so all three get their own counts and the licks they can add.
 */
export const load: PageServerLoad = async ({ fetch }) => {
	const user = requireRole('learner', 'teacher', 'admin');
	// Today's counts come from the drill's own answer, so this page and the drill always agree.
	const res = await fetch('/api/drill/today');
	const today = res.ok ? ((await res.json()) as TodayAnswer) : null;
	const [addable, classes, site] = await Promise.all([
		listAddable(user),
		user.role === 'learner' ? null : listClasses(user),
		user.role === 'admin' ? Promise.all([countUsersByRole(), checkHealth()]) : null
	]);
	const taught = (classes?.items ?? []).filter((c) => c.as === 'teacher');
	return {
		role: user.role,
		firstName: user.name.trim().split(/\s+/)[0] || user.name,
		today: today && {
			day: today.day,
			counts: today.counts,
			backlog: today.backlog,
			prompts: today.items.length,
			keys: [...new Set(today.items.map((i) => i.key))]
		},
		addable,
		teaching:
			classes &&
			taught.slice(0, 6).map((c) => ({ id: c.id, name: c.name, members: c.memberCount })),
		classCount: taught.length,
		learnerCount: taught.reduce((sum, c) => sum + c.memberCount, 0),
		site: site && {
			accounts: site[0],
			databaseOk: site[1].database.ok,
			mailMode: site[1].mail.mode,
			outboxCount: site[1].outboxCount
		}
	};
};
