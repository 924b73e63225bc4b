// Starts the built server for the end-to-end tests on a wiped data folder. Playwright's
// webServer runs this; it forwards termination so `node build` does not outlive the run.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const port = process.env.PORT ?? '4173';
const dataDir = path.resolve(process.env.DATA_DIR ?? 'tmp/e2e-data');

if (!fs.existsSync('build/index.js')) {
	console.error('No build/index.js: run `vite build` first (npm run test:e2e does).');
	process.exit(1);
}
fs.rmSync(dataDir, { recursive: true, force: true });
fs.mkdirSync(dataDir, { recursive: true });

const child = spawn(process.execPath, ['build'], {
	stdio: 'inherit',
	env: {
		...process.env,
		PORT: port,
		ORIGIN: process.env.ORIGIN ?? `http://localhost:${port}`,
		DATA_DIR: dataDir,
		// Mail goes to the app's own local stand-in, which files .eml messages in DATA_DIR/outbox.
		SMTP_URL: ''
	}
});
for (const signal of ['SIGINT', 'SIGTERM']) {
	process.on(signal, () => child.kill(signal));
}
child.on('exit', (code) => process.exit(code ?? 0));
