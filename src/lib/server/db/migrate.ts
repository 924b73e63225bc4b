import { Umzug, SequelizeStorage } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';
import { getDb } from './index';
import { migrations } from './migrations/index';

/** The umzug runner over our explicit migration list, recording progress in `schema_migrations`. */
export function createMigrator(sequelize: Sequelize): Umzug<QueryInterface> {
	return new Umzug<QueryInterface>({
		migrations: migrations.map((m) => ({ name: m.name, up: m.up, down: m.down })),
		context: sequelize.getQueryInterface(),
		storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
		logger: undefined
	});
}

/**
 * Apply every pending migration; running it again applies nothing. Returns the names applied.
 *
 * @example await migrate() // → ['0001-accounts'] on a fresh database, [] afterwards
 */
export async function migrate(sequelize: Sequelize = getDb()): Promise<string[]> {
	const applied = await createMigrator(sequelize).up();
	return applied.map((m) => m.name);
}
