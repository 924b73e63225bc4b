// `npm run demo`: migrate, seed the demo scenario, build when needed, serve on PORT.
import { existsSync, statSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { spawnSync, spawn } from 'node:child_process';

const root = path.resolve(import.meta.dirname, '..');
const port = process.env.PORT || '3000';
process.env.PORT = port;
process.env.ORIGIN ||= `http://localhost:${port}`;

function newestMtime(dir: string): number {
	let newest = 0;
	for (const entry of readdirSync(dir, { withFileTypes: true })) {
		const full = path.join(dir, entry.name);
		const time = entry.isDirectory() ? newestMtime(full) : statSync(full).mtimeMs;
		if (time > newest) newest = time;
	}
	return newest;
}

function run(command: string, args: string[]): void {
	const result = spawnSync(command, args, { stdio: 'inherit', cwd: root, env: process.env });
	if (result.status !== 0) process.exit(result.status ?? 1);
}

run('npx', ['tsx', 'scripts/migrate.ts']);
run('npx', ['tsx', 'scripts/seed.ts']);

const buildEntry = path.join(root, 'build', 'index.js');
const stale =
	!existsSync(buildEntry) ||
	Math.max(newestMtime(path.join(root, 'src')), newestMtime(path.join(root, 'static'))) >
		statSync(buildEntry).mtimeMs;
if (stale) run('npx', ['vite', 'build', '--logLevel', 'warn']);

const server = spawn('node', ['scripts/start.js'], {
	stdio: 'inherit',
	cwd: root,
	env: process.env
});
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => server.kill(signal));
server.on('exit', (code) => process.exit(code ?? 0));
