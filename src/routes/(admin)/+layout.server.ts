import { requireRole } from '$lib/server/auth/guard';
import type { LayoutServerLoad } from './$types';

/**
 * Every page of the group refuses other roles here too, so that a refusal (403) renders inside
 * the site shell with a way back; the role gate in hooks.server.ts stays the boundary.
 */
export const load: LayoutServerLoad = () => {
	requireRole('admin');
	return {};
};
