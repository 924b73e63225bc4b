import { ROLES, User, type Role } from '../db/models/index';

/**
 * What the admin overview reads about accounts. Rows are mapped to plain objects here, so no
 * password hash or settings blob reaches a page.
 */

export interface AdminUserRow {
	id: string;
	name: string;
	email: string;
	role: Role;
	emailVerified: boolean;
	/** ISO 8601. */
	createdAt: string;
}

/**
 * Accounts per role, every role present even when zero.
 * @example await countUsersByRole() // { learner: 3, teacher: 1, admin: 1 }
 */
export async function countUsersByRole(): Promise<Record<Role, number>> {
	const counts = Object.fromEntries(ROLES.map((role) => [role, 0])) as Record<Role, number>;
	const rows = (await User.count({ group: ['role'] })) as unknown as {
		role: Role;
		count: number;
	}[];
	for (const { role, count } of rows) {
		if (role in counts) counts[role] = Number(count);
	}
	return counts;
}

/**
 * The newest accounts first, at most `limit` of them.
 * @example (await listUsers({ limit: 1 }))[0] // { id: '…', name: 'Ada', email: 'ada@…', role: 'learner', … }
 */
export async function listUsers({ limit = 100 }: { limit?: number } = {}): Promise<AdminUserRow[]> {
	const rows = await User.findAll({
		attributes: ['id', 'name', 'email', 'role', 'emailVerifiedAt', 'createdAt'],
		order: [
			['createdAt', 'DESC'],
			['email', 'ASC']
		],
		limit
	});
	return rows.map((row) => ({
		id: row.id,
		name: row.name,
		email: row.email,
		role: row.role,
		emailVerified: row.emailVerifiedAt !== null,
		createdAt: row.createdAt.toISOString()
	}));
}
