import { rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkHealth } from '../../../src/lib/server/admin/health';
import { openTestWorld, type TestWorld } from '../support/world';

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(async () => {
	await world.close();
});

describe('checkHealth', () => {
	it('reports an outbox that cannot be read instead of failing the whole check', async () => {
		// A file where the outbox folder should be: listing it fails with ENOTDIR.
		const outbox = path.join(world.dataDir, 'outbox');
		await rm(outbox, { recursive: true, force: true });
		await writeFile(outbox, 'not a folder');
		const health = await checkHealth(new Date('2026-12-01T12:00:00Z'));
		expect(health).toMatchObject({
			ok: true,
			database: { ok: true, dialect: 'sqlite' },
			outboxCount: null,
			checkedAt: '2026-12-01T12:00:00.000Z'
		});
		expect(health.outboxError).toMatch(/ENOTDIR|not a directory/);
	});
});
