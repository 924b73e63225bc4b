import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { QueryTypes } from 'sequelize';
import { createMigrator, prepareMigrations } from '../../../src/lib/server/db/migrate';
import { User } from '../../../src/lib/server/db/models/index';
import { settingsOf } from '../../../src/lib/server/study/settings';
import { openTestWorld, type TestWorld } from '../support/world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld({ migrate: false });
});
afterAll(() => world.close());

describe('migration 0003-settings-columns', () => {
	test('copies the queried settings out of the JSON into their columns and keeps the rest', async () => {
		await prepareMigrations(world.db);
		const migrator = createMigrator(world.db);
		await migrator.up({ to: '0002-core-loop' });
		const insert = (id: string, settings: unknown) =>
			world.db.query(
				`INSERT INTO users (id, email, name, role, password_hash, settings, created_at, updated_at)
				 VALUES (:id, :email, 'Old', 'learner', 'x', :settings, :now, :now)`,
				{
					replacements: {
						id,
						email: `${id.slice(-4)}@old.test`,
						settings: JSON.stringify(settings),
						now: new Date().toISOString()
					}
				}
			);
		const kept = '00000000-0000-4000-8000-000000000001';
		const broken = '00000000-0000-4000-8000-000000000002';
		await insert(kept, {
			timezone: 'Europe/Lisbon',
			digestHour: 18,
			digestEnabled: false,
			instrument: 'alto-sax',
			dailyMinutes: 25
		});
		await insert(broken, { timezone: 'Nowhere/Atlantis', digestHour: 99, keyOrder: 'fourths' });

		await migrator.up();

		const rows = await world.db.query<Record<string, unknown>>(
			'SELECT id, timezone, digest_hour, digest_enabled, day_start_hour, settings FROM users ORDER BY id',
			{ type: QueryTypes.SELECT }
		);
		expect(rows.map((row) => ({ ...row, settings: JSON.parse(String(row.settings)) }))).toEqual([
			{
				id: kept,
				timezone: 'Europe/Lisbon',
				digest_hour: 18,
				digest_enabled: 0,
				day_start_hour: 4,
				settings: { instrument: 'alto-sax', dailyMinutes: 25 }
			},
			{
				id: broken,
				timezone: 'UTC',
				digest_hour: 7,
				digest_enabled: 1,
				day_start_hour: 4,
				settings: { keyOrder: 'fourths' }
			}
		]);
		expect(settingsOf((await User.findByPk(kept))!)).toMatchObject({
			timezone: 'Europe/Lisbon',
			digestHour: 18,
			digestEnabled: false,
			instrument: 'alto-sax'
		});
	});
});
