import { expect, type Locator, type Page } from '@playwright/test';

/**
 * Presses Tab until `target` has the focus, and fails after `maxStops` presses: a control the
 * keyboard cannot reach in a reasonable number of stops is a finding, not a slow test.
 * Returns the number of presses it took.
 */
export async function tabTo(page: Page, target: Locator, maxStops = 25): Promise<number> {
	for (let stops = 0; stops <= maxStops; stops++) {
		if (await target.evaluate((el) => el === document.activeElement)) return stops;
		await page.keyboard.press('Tab');
	}
	await expect(target, `not reached within ${maxStops} presses of Tab`).toBeFocused();
	return maxStops;
}
