import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from '@playwright/test';

const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

export interface AxeFinding {
	id: string;
	impact: string | null;
	help: string;
	targets: string[];
}

/** Runs axe-core in the page and returns the serious and critical violations, compactly. */
export async function seriousViolations(page: Page): Promise<AxeFinding[]> {
	// Evaluated, not added as a <script>: the page's Content-Security-Policy rightly blocks an
	// injected inline script, while an evaluation from the test tool is not the page's own.
	if (!(await page.evaluate(() => 'axe' in window))) {
		await page.evaluate(`${axeSource}\n;undefined`);
	}
	const violations = await page.evaluate(async () => {
		// @ts-expect-error axe is injected above as a global
		const results = await window.axe.run(document, { resultTypes: ['violations'] });
		return results.violations as {
			id: string;
			impact: string | null;
			help: string;
			nodes: { target: string[] }[];
		}[];
	});
	return violations
		.filter((v) => v.impact === 'serious' || v.impact === 'critical')
		.map((v) => ({
			id: v.id,
			impact: v.impact,
			help: v.help,
			targets: v.nodes.map((n) => n.target.join(' '))
		}));
}
