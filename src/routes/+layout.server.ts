import type { SessionUser } from '$lib/server/auth/session';
import type { LayoutServerLoad } from './$types';

/** What every page may know about who is signed in: nothing more than the header needs. */
export type ShellUser = Pick<SessionUser, 'id' | 'name' | 'email' | 'role'>;

export const load: LayoutServerLoad = ({ locals }) => {
	const u = locals.user;
	const user: ShellUser | null = u
		? { id: u.id, name: u.name, email: u.email, role: u.role }
		: null;
	return { user };
};
