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
// The names of the failures, printed again just above the closing line: a CI log is often read
// from its tail only, and vitest's own list scrolled away long before the end-to-end run.
const failures = [];
if (existsSync(`${out}/vitest.json`)) {
	const report = JSON.parse(readFileSync(`${out}/vitest.json`, 'utf8'));
	for (const file of report.testResults ?? []) {
		const where = file.name.replace(process.cwd() + '/', '');
		if (file.status === 'failed' && file.assertionResults.length === 0)
			failures.push(`${where}: ${String(file.message ?? 'failed to load').split('\n')[0]}`);
		for (const t of file.assertionResults)
			if (t.status === 'failed')
				failures.push(
					`${where} › ${t.fullName ?? t.title}: ${String(t.failureMessages?.[0] ?? '')
						.split('\n')
						.slice(0, 3)
						.join(' ')}`
				);
	}
	passed += report.numPassedTests;
	failed += report.numFailedTests;
	skipped += report.numPendingTests + (report.numTodoTests ?? 0);
	// A file that fails to load counts no test: count it as a failure.
	failed += (report.testResults ?? []).filter(
		(file) => file.status === 'failed' && file.assertionResults.length === 0
	).length;
} else failed += 1;
if (existsSync(`${out}/e2e.json`)) {
	const e2e = JSON.parse(readFileSync(`${out}/e2e.json`, 'utf8'));
	const stats = e2e.stats;
	const walk = (suite, titles) => {
		for (const spec of suite.specs ?? [])
			for (const t of spec.tests ?? [])
				if (t.status === 'unexpected')
					failures.push(`${spec.file} › ${[...titles, spec.title].join(' › ')}`);
		for (const child of suite.suites ?? []) walk(child, [...titles, child.title]);
	};
	for (const suite of e2e.suites ?? []) walk(suite, []);
	passed += stats.expected + stats.flaky;
	failed += stats.unexpected;
	skipped += stats.skipped;
} else failed += 1;

const anyFailed = failed > 0 || codes.some((code) => code !== 0);
if (anyFailed && failed === 0) failed = 1; // a step failed without a test to show for it
if (failures.length) console.log(`\nFailed:\n${failures.map((f) => `  ${f}`).join('\n')}`);
console.log(`\n${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(anyFailed ? 1 : 0);
