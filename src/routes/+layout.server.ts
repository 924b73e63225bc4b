import type { LayoutServerLoad } from './$types';

/** What every page may know about who is signed in: nothing more than the header needs. */
export type ShellUser = {
	id: string;
	name: string;
	email: string;
	role: 'learner' | 'teacher' | 'admin';
};

export const load: LayoutServerLoad = ({ locals }) => {
	const u = locals.user;
	const user: ShellUser | null = u
		? { id: String(u.id), name: u.name, email: u.email, role: u.role }
		: null;
	return { user };
};
