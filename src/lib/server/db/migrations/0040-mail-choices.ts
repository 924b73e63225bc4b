import { DataTypes } from 'sequelize';
import type { Migration } from './types';

/**
 * What the scheduled mails need besides the reminder columns of 0002: the teacher's weekly
 * summary as its own choice and weekday (a teacher may want the summary without the daily
 * reminder, or the other way round), and a per-person secret that signs unsubscribe links.
 *
 * The secret is per person rather than one for the whole site so that it lives in the database
 * every process shares (two servers, or a script, sign and check alike with no extra
 * configuration), and so that replacing one person's secret voids only their old links. It stays
 * null until the first scheduled mail to that person needs it.
 */
export const mailChoices: Migration = {
	name: '0040-mail-choices',
	async up({ context: qi }) {
		await qi.addColumn('users', 'summary_enabled', {
			type: DataTypes.BOOLEAN,
			allowNull: false,
			defaultValue: true
		});
		// ISO weekday of the practice day the summary goes out on: 1 Monday … 7 Sunday.
		await qi.addColumn('users', 'summary_weekday', {
			type: 'INTEGER CHECK (summary_weekday BETWEEN 1 AND 7)',
			allowNull: false,
			defaultValue: 1
		});
		await qi.addColumn('users', 'mail_secret', { type: DataTypes.STRING(64), allowNull: true });
		await qi.addIndex('users', ['summary_enabled', 'summary_weekday', 'timezone'], {
			name: 'users_summary_due'
		});
		// The scheduler looks for the learner's zone once per distinct zone and per run.
		await qi.addIndex('users', ['timezone', 'digest_enabled'], { name: 'users_zone_digest' });
	},
	async down({ context: qi }) {
		await qi.removeIndex('users', 'users_zone_digest');
		await qi.removeIndex('users', 'users_summary_due');
		// On SQLite removeColumn rebuilds `users` with DROP TABLE, which would cascade to every
		// table that references it: foreign keys stay off while it runs, and are checked after.
		const sqlite = qi.sequelize.getDialect() === 'sqlite';
		if (sqlite) await qi.sequelize.query('PRAGMA foreign_keys = OFF');
		try {
			for (const column of ['mail_secret', 'summary_weekday', 'summary_enabled']) {
				await qi.removeColumn('users', column);
			}
			if (sqlite) {
				const [broken] = await qi.sequelize.query('PRAGMA foreign_key_check');
				if (broken.length) throw new Error(`Foreign keys broken: ${JSON.stringify(broken)}`);
			}
		} finally {
			if (sqlite) await qi.sequelize.query('PRAGMA foreign_keys = ON');
		}
	}
};
