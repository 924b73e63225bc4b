import type { User, Role } from '../db/models/index';
import type { UserSettings } from '../../practice/settings';
import { settingsOf } from '../study/settings';

/** The signed-in person as pages and endpoints see them (`locals.user`). */
export interface SessionUser {
	id: string;
	email: string;
	name: string;
	role: Role;
	emailVerified: boolean;
	/** Normalised once, when the row is read: routes use these and never parse storage. */
	settings: UserSettings;
}

/**
 * The user as services hand it out, built in this one place from a row: never the password hash.
 * @example toSessionUser(row) // → { id: '…', email: 'ada@example.com', role: 'learner', emailVerified: false, settings: { … } }
 */
export function toSessionUser(row: User): SessionUser {
	return {
		id: row.id,
		email: row.email,
		name: row.name,
		role: row.role,
		emailVerified: row.emailVerifiedAt instanceof Date,
		settings: settingsOf(row)
	};
}
