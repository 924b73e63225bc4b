import { requireRole } from '$lib/server/auth/guard';
import type { PageServerLoad } from './$types';

// Teachers and admins may drill too; the hook has already turned away anonymous visitors.
export const load: PageServerLoad = () => {
	const user = requireRole('learner', 'teacher', 'admin');
	return { firstName: user.name.trim().split(/\s+/)[0] || user.name };
};
