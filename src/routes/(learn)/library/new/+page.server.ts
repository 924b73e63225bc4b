import { requireUser } from '$lib/server/auth/guard';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = () => {
	const user = requireUser();
	return { instrument: user.settings.instrument ?? 'concert' };
};
