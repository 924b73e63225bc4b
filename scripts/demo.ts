// `npm run demo`: migrate, seed the demo scenario, build when needed, serve on PORT.
import { existsSync, statSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { spawnSync, spawn } from 'node:child_process';
import { DEMO_ACCOUNTS } from '../src/lib/server/demo/seed';

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
if (stale) build();

/**
 * The production build, quietly: its chunk-size warnings and "run npm run preview" advice are
 * for developers, not for someone trying the demo. Shown in full only when the build fails.
 */
function build(): void {
	console.log('Building the app (the first run, or after a change: about a minute)…');
	const result = spawnSync('npx', ['vite', 'build', '--logLevel', 'error'], {
		cwd: root,
		env: process.env,
		encoding: 'utf8',
		maxBuffer: 64 * 1024 * 1024
	});
	if (result.status !== 0) {
		process.stdout.write(result.stdout ?? '');
		process.stderr.write(result.stderr ?? '');
		console.error('The build failed; the messages above say why.');
		process.exit(result.status ?? 1);
	}
}

/** Who to sign in as: the seeded accounts and their shared password. */
function printAccounts(): void {
	const password = process.env.DEMO_PASSWORD || 'demo-password-12';
	const width = Math.max(...DEMO_ACCOUNTS.map((a) => a.email.length));
	console.log('');
	console.log(`Twelvefold demo on ${process.env.ORIGIN}`);
	console.log(`Sign in with any of these accounts; the password is ${password}`);
	for (const account of DEMO_ACCOUNTS) {
		console.log(`  ${account.email.padEnd(width)}  ${account.role.padEnd(8)} ${account.name}`);
	}
	console.log('');
}

printAccounts();

const server = spawn('node', ['scripts/start.js'], {
	stdio: 'inherit',
	cwd: root,
	env: process.env
});
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => server.kill(signal));
server.on('exit', (code) => process.exit(code ?? 0));
