import { normalizeSettings, type UserSettings } from '../auth/settings';
import { hashPassword } from '../auth/password';
import { getDb } from '../db/index';
import { User, type Role } from '../db/models/index';

/**
 * The demo scenario: an invented evening school, the Lantern Street Jazz Workshop, with one
 * teacher and three learners on different instruments. Every name here is made up.
 */
export interface DemoAccount {
	email: string;
	name: string;
	role: Role;
	settings: Partial<UserSettings>;
}

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
	{ email: 'admin@example.com', name: 'Workshop Admin', role: 'admin', settings: {} },
	{
		email: 'teacher@example.com',
		name: 'Rosa Delgado-Finch',
		role: 'teacher',
		settings: { timezone: 'Europe/Berlin', instrument: 'piano' }
	},
	{
		email: 'guitar@example.com',
		name: 'Theo Marsh',
		role: 'learner',
		settings: { timezone: 'Europe/Berlin', instrument: 'guitar', dailyMinutes: 20 }
	},
	{
		email: 'alto@example.com',
		name: 'Ines Kowal',
		role: 'learner',
		settings: { timezone: 'Europe/Lisbon', instrument: 'alto-sax', digestHour: 18 }
	},
	{
		email: 'trumpet@example.com',
		name: 'Sam Adeyemi',
		role: 'learner',
		settings: { timezone: 'America/New_York', instrument: 'trumpet', keyOrder: 'fourths' }
	}
];

export interface SeedReport {
	created: string[];
	kept: string[];
}

/**
 * Create whatever of the demo scenario is missing. Idempotent: an account that exists is left
 * exactly as it is (its password, role and settings included), so seeding twice changes nothing.
 */
export async function seedDemo(password: string, now = new Date()): Promise<SeedReport> {
	const db = getDb();
	const report: SeedReport = { created: [], kept: [] };
	const hash = await hashPassword(password);
	await db.transaction(async (transaction) => {
		for (const account of DEMO_ACCOUNTS) {
			const existing = await User.findOne({ where: { email: account.email }, transaction });
			if (existing) {
				report.kept.push(account.email);
				continue;
			}
			await User.create(
				{
					email: account.email,
					name: account.name,
					role: account.role,
					passwordHash: hash,
					emailVerifiedAt: now,
					settings: normalizeSettings(account.settings)
				},
				{ transaction }
			);
			report.created.push(account.email);
		}
	});
	return report;
}
