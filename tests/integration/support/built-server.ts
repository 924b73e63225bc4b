/**
 * The built server (`node build`) in a child process on loopback, for tests that need the real
 * thing: several processes on one database, real headers from Kit. Builds first when `build/` is
 * missing or older than `src/`.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, rmSync, statSync } from 'node:fs';
import { createServer } from 'node:net';
import path from 'node:path';

export const ROOT = path.resolve(import.meta.dirname, '../../..');

function newest(dir: string): number {
	let t = 0;
	for (const e of readdirSync(dir, { withFileTypes: true })) {
		const full = path.join(dir, e.name);
		t = Math.max(t, e.isDirectory() ? newest(full) : statSync(full).mtimeMs);
	}
	return t;
}

function fresh(): boolean {
	const entry = path.join(ROOT, 'build', 'index.js');
	return existsSync(entry) && statSync(entry).mtimeMs >= newest(path.join(ROOT, 'src'));
}

const sleep = (ms: number) => Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);

/**
 * Build when `build/` is stale. Test files run in parallel processes, and two builds into one
 * folder would break each other: a lock folder (mkdir is atomic) lets one build while the others
 * wait and then find the build fresh. A lock older than ten minutes is a crashed builder's.
 */
export function ensureBuild(): void {
	const lock = path.join(ROOT, 'tmp', 'build.lock');
	mkdirSync(path.dirname(lock), { recursive: true });
	for (;;) {
		if (fresh()) return;
		try {
			mkdirSync(lock);
		} catch {
			const since = statSync(lock, { throwIfNoEntry: false })?.mtimeMs ?? Date.now();
			if (Date.now() - since > 600_000) {
				rmSync(lock, { recursive: true, force: true });
			} else sleep(1000);
			continue;
		}
		try {
			if (fresh()) return;
			const built = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], {
				cwd: ROOT,
				stdio: 'inherit'
			});
			if (built.status !== 0) throw new Error('vite build failed');
			return;
		} finally {
			rmSync(lock, { recursive: true, force: true });
		}
	}
}

export async function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const s = createServer();
		s.once('error', reject);
		s.listen(0, '127.0.0.1', () => {
			const { port } = s.address() as { port: number };
			s.close(() => resolve(port));
		});
	});
}

export interface BuiltServer {
	port: number;
	origin: string;
	stop(signal?: NodeJS.Signals): Promise<void>;
}

/** Start `node build` against `dataDir` (and its `test.sqlite`); resolves once it answers. */
export async function startBuiltServer(
	dataDir: string,
	env: Record<string, string> = {}
): Promise<BuiltServer> {
	const port = await freePort();
	const origin = `http://127.0.0.1:${port}`;
	const child: ChildProcess = spawn(process.execPath, ['build'], {
		cwd: ROOT,
		stdio: ['ignore', 'ignore', 'inherit'],
		env: {
			...process.env,
			PORT: String(port),
			HOST: '127.0.0.1',
			ORIGIN: origin,
			DATA_DIR: dataDir,
			DATABASE_URL: `sqlite:${path.join(dataDir, 'test.sqlite')}`,
			SMTP_URL: '',
			DIGEST_SCHEDULE: 'off',
			NODE_ENV: 'production',
			...env
		}
	});
	const stop = (signal: NodeJS.Signals = 'SIGTERM') =>
		new Promise<void>((resolve) => {
			if (child.exitCode !== null) return resolve();
			child.once('exit', () => resolve());
			child.kill(signal);
		});
	const deadline = Date.now() + 30_000;
	while (Date.now() < deadline) {
		if (child.exitCode !== null) throw new Error(`The built server exited (${child.exitCode}).`);
		try {
			const res = await fetch(`${origin}/api/me`, { signal: AbortSignal.timeout(1000) });
			if (res.status === 401) return { port, origin, stop };
		} catch {
			// not listening yet
		}
		await new Promise((r) => setTimeout(r, 100));
	}
	await stop('SIGKILL');
	throw new Error('The built server did not start within 30 s.');
}
