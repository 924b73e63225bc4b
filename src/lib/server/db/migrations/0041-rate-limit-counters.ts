import type { Migration } from './types';

/**
 * The rate limits' counters (`auth/rate-limit.ts`), in the database so that a limit holds across
 * every process sharing it. One row per limit (`bucket`), key (`subject`, a hash of the e-mail or
 * network address, never the address itself) and fixed window (`window_start`, ms since the
 * epoch). The primary key is what lets a hit be counted by one `INSERT … ON CONFLICT DO UPDATE`
 * on SQLite and PostgreSQL alike; `expires_at` lets old windows be deleted in one indexed sweep.
 */
export const rateLimitCounters: Migration = {
	name: '0041-rate-limit-counters',
	async up({ context: qi }) {
		await qi.sequelize.query(
			`CREATE TABLE rate_limit_counters (
				bucket VARCHAR(40) NOT NULL,
				subject VARCHAR(64) NOT NULL,
				window_start BIGINT NOT NULL,
				hits INTEGER NOT NULL CHECK (hits >= 0),
				expires_at BIGINT NOT NULL,
				PRIMARY KEY (bucket, subject, window_start)
			)`
		);
		await qi.addIndex('rate_limit_counters', ['expires_at'], {
			name: 'rate_limit_counters_expiry'
		});
	},
	async down({ context: qi }) {
		await qi.dropTable('rate_limit_counters');
	}
};
