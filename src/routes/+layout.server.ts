import type { ShellUser } from '$lib/ui/shell';
import type { LayoutServerLoad } from './$types';

export type { ShellUser } from '$lib/ui/shell';

export const load: LayoutServerLoad = ({ locals }) => {
	const u = locals.user;
	const user: ShellUser | null = u
		? { id: u.id, name: u.name, email: u.email, role: u.role }
		: null;
	return { user };
};
