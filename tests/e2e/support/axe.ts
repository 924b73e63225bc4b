import { createRequire } from 'node:module';
import type { Page } from '@playwright/test';

const require = createRequire(import.meta.url);
const axePath = require.resolve('axe-core/axe.min.js');

export interface AxeFinding {
	id: string;
	impact: string | null;
	help: string;
	targets: string[];
}

/** Runs axe-core in the page and returns the serious and critical violations, compactly. */
export async function seriousViolations(page: Page): Promise<AxeFinding[]> {
	await page.addScriptTag({ path: axePath });
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
