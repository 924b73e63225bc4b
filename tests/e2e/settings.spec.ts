import { expect, test } from '@playwright/test';
import { signInAsNew } from './support/accounts';
import { tabTo } from './support/keyboard';

test('a learner picks the alto saxophone, it is kept, and the try-it box starts on it', async ({
	page,
	request
}) => {
	await signInAsNew(page, request, 'learner');

	await page.goto('/settings');
	await expect(page.locator('html')).toHaveAttribute('data-live', 'yes');
	const practice = page.getByRole('region', { name: 'Practice' });
	await practice.getByLabel('Instrument').selectOption({ label: 'E-flat alto saxophone' });
	await practice.getByRole('radio', { name: /Round the cycle of fourths/ }).check();
	await practice.getByLabel('Minutes a day').fill('25');
	await practice.getByRole('button', { name: 'Save practice settings' }).click();
	await expect(page).toHaveURL(/\/settings\?changed=practice$/);
	await expect(practice.getByRole('status')).toHaveText(/Saved/);

	await page.goto('/settings');
	await expect(practice.getByLabel('Instrument')).toHaveValue('alto-sax');
	await expect(practice.getByRole('radio', { name: /Round the cycle of fourths/ })).toBeChecked();
	await expect(practice.getByLabel('Minutes a day')).toHaveValue('25');

	await page.goto('/');
	await expect(page.locator('#try-instrument')).toHaveValue('alto-sax');
	await expect(page.getByLabel('Instrument', { exact: true })).toHaveValue('alto-sax');
});

test('a time zone that does not exist is refused beside its field and nothing is saved', async ({
	page,
	request
}) => {
	await signInAsNew(page, request, 'learner');

	await page.goto('/settings');
	await expect(page.locator('html')).toHaveAttribute('data-live', 'yes');
	const zone = page.getByLabel('Time zone');
	await zone.fill('Nowhere/Atlantis');
	await page.getByLabel('Instrument').selectOption('trumpet');
	await page.getByRole('button', { name: 'Save practice settings' }).click();
	await expect(zone).toHaveAttribute('aria-invalid', 'true');
	await expect(zone).toHaveAccessibleDescription(/region and city/);
	// What was typed stays for correcting.
	await expect(zone).toHaveValue('Nowhere/Atlantis');

	const me = await page.request.get('/api/me');
	expect((await me.json()).settings).toMatchObject({ timezone: 'UTC', instrument: 'concert' });
});

test('the practice form works from the keyboard alone', async ({ page, request }) => {
	await signInAsNew(page, request, 'learner');

	await page.goto('/settings');
	await expect(page.locator('html')).toHaveAttribute('data-live', 'yes');
	const weakest = page.getByRole('radio', { name: /Weakest keys first/ });
	await tabTo(page, weakest, 40);
	// Arrow keys move within a radio group, as everywhere.
	await page.keyboard.press('ArrowRight');
	await expect(page.getByRole('radio', { name: /Round the cycle of fourths/ })).toBeChecked();
	const reminder = page.getByRole('checkbox', { name: /one mail a day/ });
	await tabTo(page, reminder);
	await page.keyboard.press('Space');
	await expect(reminder).not.toBeChecked();
	await tabTo(page, page.getByRole('button', { name: 'Save practice settings' }));
	await page.keyboard.press('Enter');
	await expect(page).toHaveURL(/\/settings\?changed=practice$/);

	const me = await page.request.get('/api/me');
	expect((await me.json()).settings).toMatchObject({ keyOrder: 'fourths', digestEnabled: false });
});

test('a choice made before the page is live is kept through hydration and saved', async ({
	page,
	request
}) => {
	await signInAsNew(page, request, 'learner');
	// Hold the app's scripts back, as a slow phone network would, and choose meanwhile.
	let release!: () => void;
	const held = new Promise<void>((resolve) => (release = resolve));
	await page.route(/\/_app\/immutable\/entry\//, async (route) => {
		await held;
		await route.continue();
	});
	await page.goto('/settings', { waitUntil: 'domcontentloaded' });
	const practice = page.getByRole('region', { name: 'Practice' });
	await practice.getByLabel('Instrument').selectOption('trumpet');
	await practice.getByLabel('Minutes a day').fill('35');
	await expect(page.locator('html')).not.toHaveAttribute('data-live', 'yes');
	release();
	await expect(page.locator('html')).toHaveAttribute('data-live', 'yes');
	await expect(practice.getByLabel('Instrument')).toHaveValue('trumpet');
	await expect(practice.getByLabel('Minutes a day')).toHaveValue('35');
	await practice.getByRole('button', { name: 'Save practice settings' }).click();
	await expect(practice.getByRole('status')).toHaveText(/Saved/);
	const me = await page.request.get('/api/me');
	expect((await me.json()).settings).toMatchObject({ instrument: 'trumpet', dailyMinutes: 35 });
});
