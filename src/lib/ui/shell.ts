import type { Role } from '../forms/account';

/** What every page may know about who is signed in: nothing more than the site header needs. */
export interface ShellUser {
	id: string;
	name: string;
	email: string;
	role: Role;
}
