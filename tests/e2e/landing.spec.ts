import { expect, test, type Page } from '@playwright/test';

/** Open the landing page and wait until the try-it box is interactive (hydrated). */
async function openTryIt(page: Page) {
	await page.goto('/');
	await expect(page.getByRole('button', { name: 'Show this key' })).toBeEnabled();
}

test('the landing page answers 200, names the product and says the job', async ({ page }) => {
	const response = await page.goto('/');
	expect(response?.status()).toBe(200);
	await expect(page).toHaveTitle(/Twelvefold/);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(
		/Learn a lick once.\s*Own it in all twelve keys./
	);
	await expect(page.getByRole('link', { name: 'Create your account' })).toHaveAttribute(
		'href',
		'/sign-up'
	);
	await expect(page.getByRole('link', { name: 'Sign in' })).toBeVisible();
});

test.describe('the try-it box', () => {
	test('writes the lick in another key with notation and degree labels', async ({ page }) => {
		await openTryIt(page);
		await page.getByLabel('Key', { exact: true }).selectOption('Eb');
		await page.getByRole('button', { name: 'Show this key' }).click();

		const result = page.getByTestId('try-result');
		await expect(result).toContainText('In E♭');
		await expect(result.getByTestId('notation').locator('svg').first()).toBeVisible();
		// The sample's first chord is C7; a minor third up it becomes E♭7, starting on its root.
		await expect(result.getByRole('list', { name: 'Degrees over Eb7' })).toBeVisible();
		const first = result
			.getByRole('list', { name: 'Degrees over Eb7' })
			.getByRole('listitem')
			.first();
		await expect(first).toContainText('R');
		await expect(first).toContainText('E♭');
		await expect(result.getByRole('button', { name: 'Play' })).toBeEnabled();
	});

	test('starts from one of our demo licks, with its teaching note, and names its device', async ({
		page
	}) => {
		await openTryIt(page);
		await page.getByLabel('Start from one of ours').selectOption('tin-roof');
		await expect(page.getByLabel('Your lick in abc notation')).toHaveValue(/T:Tin roof/);
		await expect(page.getByText('An Fmaj7 arpeggio built on the b7 of G7')).toBeVisible();
		await page.getByRole('button', { name: 'Show this key' }).click();
		const result = page.getByTestId('try-result');
		// REFERENCES.md §3: Fmaj7 from the b7 of G7 gives b7 9 11 13.
		await expect(result).toContainText('arpeggio (F A C E) laid over G7');
		// Editing the text makes it the learner's own; the example comes back on request.
		await page.getByLabel('Your lick in abc notation').fill('X:1\nK:C\n"C7" c e g _b|');
		await expect(page.getByText('Your own version: edit away.')).toBeVisible();
		await page.getByRole('button', { name: 'Back to the example' }).click();
		await expect(page.getByLabel('Your lick in abc notation')).toHaveValue(/T:Tin roof/);
	});

	test('a guitar adds a tablature staff', async ({ page }) => {
		await openTryIt(page);
		await page.getByLabel('Instrument').selectOption('guitar');
		await page.getByRole('button', { name: 'Show this key' }).click();
		const notation = page.getByTestId('try-result').getByTestId('notation');
		await expect(notation.locator('svg').first()).toBeVisible();
		await expect(notation.locator('.abcjs-tab-number').first()).toBeVisible();
	});

	test('a broken lick gets an error with its line and column', async ({ page }) => {
		await openTryIt(page);
		await page
			.getByLabel('Your lick in abc notation')
			.fill('X:1\nM:4/4\nL:1/8\nK:C\n"C7 c d e f |');
		await page.getByRole('button', { name: 'Show this key' }).click();
		const error = page.getByTestId('abc-error');
		await expect(error).toBeVisible();
		await expect(error).toContainText(/Line 5, column \d+:/);
		await expect(page.getByLabel('Your lick in abc notation')).toHaveAttribute(
			'aria-invalid',
			'true'
		);
		await expect(page.getByTestId('try-result')).toHaveCount(0);
	});

	test('shows the lick in all twelve keys from one request', async ({ page }) => {
		await openTryIt(page);
		await page.getByRole('button', { name: 'All twelve keys' }).click();
		const list = page.getByRole('list', { name: 'The lick in every key' });
		await expect(list.getByRole('listitem')).toHaveCount(12, { timeout: 20_000 });
		await expect(list.locator('svg')).toHaveCount(12);
		await expect(page.getByText(/All 12 keys, round the cycle of fourths/)).toBeVisible();
	});

	test('plays the lick with a count-in at a low starting volume, and stops', async ({ page }) => {
		await openTryIt(page);
		await page.getByRole('button', { name: 'Show this key' }).click();
		const result = page.getByTestId('try-result');
		const volume = result.getByLabel('Volume');
		await expect(volume).toHaveValue('25');
		await expect(volume).toHaveAccessibleDescription(/moderate level/);
		await expect(result.getByLabel('Tempo (bpm)')).toHaveValue('132');
		await result.getByRole('button', { name: 'Play' }).click();
		await expect(result.getByRole('button', { name: 'Stop' })).toBeVisible();
		await expect(result.getByRole('alert')).toHaveCount(0);
		await result.getByRole('button', { name: 'Stop' }).click();
		await expect(result.getByRole('button', { name: 'Play' })).toBeVisible();
	});
});
