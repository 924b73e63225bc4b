import { requireRole } from '$lib/server/auth/guard';
import type { ProgressAnswer } from '$lib/practice/api';
import type { PageServerLoad } from './$types';

// The page shows what `GET /api/drill/progress` answers, asked for on the server (the session
// cookie goes with it), so the page and the API can never tell two stories.
export const load: PageServerLoad = async ({ fetch }) => {
	requireRole('learner', 'teacher', 'admin');
	const res = await fetch('/api/drill/progress');
	if (!res.ok) {
		const payload = await res.json().catch(() => null);
		return {
			progress: null,
			problem: payload?.error?.message ?? `Progress could not be loaded (${res.status}).`
		};
	}
	return { progress: (await res.json()) as ProgressAnswer, problem: null };
};
