import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { resetConfig } from '$lib/server/config';

/**
 * A fresh DATA_DIR for one test file, with the configuration cache cleared so `getConfig()`
 * sees it. Returns a cleanup that removes the folder and restores the environment.
 */
export async function useTempDataDir(env: Record<string, string | undefined> = {}) {
	const dir = await mkdtemp(path.join(os.tmpdir(), 'twelvefold-mail-'));
	const saved = { DATA_DIR: process.env.DATA_DIR, SMTP_URL: process.env.SMTP_URL };
	process.env.DATA_DIR = dir;
	delete process.env.SMTP_URL;
	for (const [key, value] of Object.entries(env)) {
		if (value === undefined) delete process.env[key];
		else process.env[key] = value;
	}
	resetConfig();
	return {
		dir,
		outbox: path.join(dir, 'outbox'),
		async cleanup() {
			for (const [key, value] of Object.entries(saved)) {
				if (value === undefined) delete process.env[key];
				else process.env[key] = value;
			}
			resetConfig();
			await rm(dir, { recursive: true, force: true });
		}
	};
}
