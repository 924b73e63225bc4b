import { requireRole } from '$lib/server/auth/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = () => {
	const user = requireRole('teacher', 'admin');
	return { firstName: user.name.trim().split(/\s+/)[0] || user.name };
};
