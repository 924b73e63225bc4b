import { normalizeSettings, type UserSettings } from '../../practice/settings';
import { toSettingsColumns } from '../study/settings';
import { hashPassword } from '../auth/password';
import { checkNewPassword } from '../auth/password-strength';
import { getDb } from '../db/index';
import { Deck, DeckLick, Lick, LickTag, User, type Role } from '../db/models/index';
import { DEMO_DECKS, DEMO_LICKS } from '../../demo/licks';
import { readLickHome } from '../../music/home';
import type { Transaction } from 'sequelize';
import { seedDemoPractice } from './practice';
import { seedDemoHistory } from './history';

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
	// The demo accounts get no exception from the password rule: a weak DEMO_PASSWORD is refused
	// here with the sign-up form's own reason, before anything is written.
	for (const account of DEMO_ACCOUNTS) {
		const check = await checkNewPassword(password, account);
		if (!check.ok) throw new Error(`DEMO_PASSWORD for ${account.email}: ${check.message}`);
	}
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
					...toSettingsColumns(normalizeSettings(account.settings))
				},
				{ transaction }
			);
			report.created.push(account.email);
		}
		const teacher = await User.findOne({ where: { email: TEACHER_EMAIL }, transaction });
		if (teacher) await seedDemoLibrary(teacher.id, report, transaction);
	});
	// The class comes first, so that the demo learners' cards are the class's (with its pace and
	// keys); the drill's own demo cards then fill in whatever the class does not cover.
	const teacher = await User.findOne({ where: { email: TEACHER_EMAIL } });
	if (teacher) {
		const decks = await Promise.all(
			DEMO_DECKS.map((d) => Deck.findOne({ where: { ownerId: teacher.id, name: d.title } }))
		);
		const history = await seedDemoHistory(
			TEACHER_EMAIL,
			decks.filter((d) => d !== null).map((d) => d.id),
			now
		);
		if (!history.skipped) {
			report.created.push(`history:${history.sittings} sittings, ${history.reviews} reviews`);
		}
	}
	const learners = DEMO_ACCOUNTS.filter((a) => a.role === 'learner').map((a) => a.email);
	for (const { email, created } of await seedDemoPractice(TEACHER_EMAIL, learners, now)) {
		if (created > 0) report.created.push(`cards:${email}:${created}`);
	}
	return report;
}

/** The demo teacher, author of the demo licks. */
export const TEACHER_EMAIL = 'teacher@example.com';

/**
 * The demo licks as the demo teacher's library, in the two demo decks. A lick or deck already
 * there (by title or name) is kept as it is.
 */
async function seedDemoLibrary(
	authorId: string,
	report: SeedReport,
	transaction: Transaction
): Promise<void> {
	const lickIds = new Map<string, string>();
	for (const demo of DEMO_LICKS) {
		const existing = await Lick.findOne({ where: { authorId, title: demo.title }, transaction });
		if (existing) {
			lickIds.set(demo.slug, existing.id);
			continue;
		}
		const read = readLickHome(demo.abc);
		if (!read.ok) throw new Error(`Demo lick ${demo.slug} does not parse: ${read.error.message}`);
		const tempo = Number(/^Q:\s*1\/4\s*=\s*(\d+)/m.exec(demo.abc)?.[1] ?? 120);
		const lick = await Lick.create(
			{
				authorId,
				title: demo.title,
				abc: demo.abc,
				homeKey: read.home.key,
				homeQuality: read.home.quality ?? '7',
				note: demo.note,
				tempo,
				swingRatio: 2,
				visibility: 'classes'
			},
			{ transaction }
		);
		await LickTag.bulkCreate(
			demo.devices.map((tag) => ({ lickId: lick.id, tag })),
			{ transaction }
		);
		lickIds.set(demo.slug, lick.id);
		report.created.push(`lick:${demo.slug}`);
	}
	for (const demoDeck of DEMO_DECKS) {
		const existing = await Deck.findOne({
			where: { ownerId: authorId, name: demoDeck.title },
			transaction
		});
		if (existing) continue;
		const deck = await Deck.create({ ownerId: authorId, name: demoDeck.title }, { transaction });
		const members = DEMO_LICKS.filter((l) => l.deck === demoDeck.slug);
		await DeckLick.bulkCreate(
			members.map((l, position) => ({ deckId: deck.id, lickId: lickIds.get(l.slug)!, position })),
			{ transaction }
		);
		report.created.push(`deck:${demoDeck.slug}`);
	}
}
