// `npm test`: every suite in turn (unit + integration in vitest, then end-to-end in Chromium
// against the built server), whatever the earlier ones gave, then one closing line
// `N passed, N failed` that totals them all (CI reads that line).
import { spawnSync } from 'node:child_process';
import { readFileSync, rmSync, mkdirSync, existsSync } from 'node:fs';

// Not Playwright's own `test-results/`, which it empties when it starts.
const out = 'tmp/reports';
rmSync(`${out}/vitest.json`, { force: true });
rmSync(`${out}/e2e.json`, { force: true });
mkdirSync(out, { recursive: true });

function run(command, args, env = {}) {
	const result = spawnSync(command, args, { stdio: 'inherit', env: { ...process.env, ...env } });
	return result.status ?? 1;
}

const codes = [];
codes.push(
	run('npx', [
		'vitest',
		'run',
		'--reporter=default',
		'--reporter=json',
		`--outputFile.json=${out}/vitest.json`
	])
);
codes.push(run('node', ['scripts/ensure-chromium.js']));
codes.push(run('npx', ['vite', 'build', '--logLevel', 'warn']));
codes.push(run('npx', ['playwright', 'test'], { PLAYWRIGHT_JSON_OUTPUT_NAME: `${out}/e2e.json` }));

let passed = 0;
let failed = 0;
let skipped = 0;
if (existsSync(`${out}/vitest.json`)) {
	const report = JSON.parse(readFileSync(`${out}/vitest.json`, 'utf8'));
	passed += report.numPassedTests;
	failed += report.numFailedTests;
	skipped += report.numPendingTests + (report.numTodoTests ?? 0);
	// A file that fails to load counts no test: count it as a failure.
	failed += (report.testResults ?? []).filter(
		(file) => file.status === 'failed' && file.assertionResults.length === 0
	).length;
} else failed += 1;
if (existsSync(`${out}/e2e.json`)) {
	const stats = JSON.parse(readFileSync(`${out}/e2e.json`, 'utf8')).stats;
	passed += stats.expected + stats.flaky;
	failed += stats.unexpected;
	skipped += stats.skipped;
} else failed += 1;

const anyFailed = failed > 0 || codes.some((code) => code !== 0);
if (anyFailed && failed === 0) failed = 1; // a step failed without a test to show for it
console.log(`\n${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(anyFailed ? 1 : 0);
