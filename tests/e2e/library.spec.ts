import { execFileSync } from 'node:child_process';
import { expect, test, type Page } from '@playwright/test';
import { E2E_DATA_DIR } from './support/env';

/**
 * The lick library end to end, as the demo teacher: write a lick (an error shows at its place and
 * goes), save it, upload and play a recording, print the twelve-key sheet, import a file with a
 * broken tune, build a deck and reorder it by keyboard, share a lick that a visitor then opens.
 */

test.describe.configure({ mode: 'serial' });

const shots = process.env.SCREENSHOTS ? 'docs/screenshots' : null;

/** A README picture at desktop size, then at phone size (`-mobile`), back to desktop after. */
async function shoot(page: Page, name: string, fullPage = false) {
	if (!shots) return;
	await page.evaluate(() => document.fonts.ready);
	await page.screenshot({ path: `${shots}/${name}.png`, fullPage });
	await page.setViewportSize({ width: 390, height: 844 });
	await page.waitForTimeout(600);
	await page.screenshot({ path: `${shots}/${name}-mobile.png`, fullPage });
	await page.setViewportSize({ width: 1280, height: 800 });
}

async function signInAsDemoTeacher(page: Page) {
	const res = await page.request.post('/api/auth/sign-in', {
		data: { email: 'teacher@example.com', password: 'demo-password-12' }
	});
	expect(res.status(), await res.text()).toBe(200);
}

/** A tiny valid PCM wav: half a second of a quiet 440 Hz tone, 8-bit mono at 8 kHz. */
function tinyWav(): Buffer {
	const samples = 4000;
	const buf = Buffer.alloc(44 + samples);
	buf.write('RIFF', 0);
	buf.writeUInt32LE(36 + samples, 4);
	buf.write('WAVEfmt ', 8);
	buf.writeUInt32LE(16, 16);
	buf.writeUInt16LE(1, 20);
	buf.writeUInt16LE(1, 22);
	buf.writeUInt32LE(8000, 24);
	buf.writeUInt32LE(8000, 28);
	buf.writeUInt16LE(1, 32);
	buf.writeUInt16LE(8, 34);
	buf.write('data', 36);
	buf.writeUInt32LE(samples, 40);
	for (let i = 0; i < samples; i++)
		buf[44 + i] = 128 + Math.round(20 * Math.sin((2 * Math.PI * 440 * i) / 8000));
	return buf;
}

const abc = (title: string, line: string) =>
	`X:1\nT:${title}\nM:4/4\nL:1/8\nQ:1/4=126\nK:F\n${line}`;

let lickUrl = '';

test.beforeAll(() => {
	// The demo school, as `npm run demo` seeds it, into the server's data folder.
	execFileSync(process.execPath, ['--import', 'tsx', 'scripts/seed.ts'], {
		env: { ...process.env, DATA_DIR: E2E_DATA_DIR, DEMO_PASSWORD: 'demo-password-12' },
		stdio: 'pipe'
	});
});

test('the demo teacher’s library shows the demo licks, and a lick written in the editor is checked in place and saved', async ({
	page
}) => {
	// Writing, checking, saving, reloading and overriding the home key: a long walk on two cores.
	test.slow();
	await signInAsDemoTeacher(page);
	await page.goto('/library');
	const table = page.getByTestId('library-table');
	for (const title of ['Blue turn', 'Porch light', 'Night bus']) {
		await expect(table.getByRole('link', { name: title })).toBeVisible();
	}
	await shoot(page, 'library');
	await page
		.getByRole('navigation', { name: 'Main' })
		.getByRole('link', { name: 'Library' })
		.waitFor();

	await page.getByRole('link', { name: 'Write a lick' }).click();
	await expect(page).toHaveURL(/\/library\/new$/);
	await page.getByLabel('Title').fill('Evening walk');
	const text = page.getByLabel('The lick in abc notation, at concert pitch');
	// A voice overlay (&) is refused by the engine: line 7 of the text, at the ampersand.
	await text.fill(abc('Evening walk', "\"F7\" f a c' & e' d' c' a | f4 z4 |]"));
	const error = page.getByTestId('abc-error');
	await expect(error).toContainText('Line 7, column 13');
	await expect(page.getByTestId('abc-error-mark')).toHaveText('&');
	await text.fill(abc('Evening walk', "\"F7\" f a c' _e' d' c' a g | f4 z4 |]"));
	await expect(error).toBeHidden();
	await expect(page.getByTestId('notation').first().locator('svg')).toBeVisible();
	await expect(page.getByTestId('key-grid').locator('li')).toHaveCount(12);
	await page.getByRole('button', { name: 'Save the lick' }).click();
	await expect(page).toHaveURL(/\/library\/[0-9a-f-]{36}$/);
	await expect(page.getByTestId('save-state')).toHaveText('All changes saved.');
	lickUrl = new URL(page.url()).pathname;

	// Unsaved changes: kept across a reload, and leaving asks first.
	await page.getByLabel('Title').fill('Evening walk, slower');
	await expect(page.getByTestId('save-state')).toContainText('Unsaved');
	await page.reload();
	await expect(page.getByText('Unsaved changes restored')).toBeVisible();
	await expect(page.getByLabel('Title')).toHaveValue('Evening walk, slower');
	page.once('dialog', (d) => void d.dismiss());
	await page
		.getByRole('navigation', { name: 'Main' })
		.getByRole('link', { name: 'Library' })
		.click();
	await expect(page).toHaveURL(lickUrl);
	await page.getByRole('button', { name: 'Discard them' }).click();
	await expect(page.getByLabel('Title')).toHaveValue('Evening walk');
	await shoot(page, 'lick-editor');

	// The home key and quality follow the abc unless overridden; an override is kept.
	const homeKey = page.getByLabel('Home key');
	await expect(homeKey).toHaveValue('');
	await expect(homeKey.locator('option').first()).toHaveText('As the abc reads it (F)');
	await expect(page.getByLabel('Home chord quality').locator('option').first()).toContainText(
		'As the first chord reads it (Dominant'
	);
	await homeKey.selectOption('Bb');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByTestId('save-state')).toHaveText('Saved.');
	await page.reload();
	await expect(page.getByLabel('Home key')).toHaveValue('Bb');
	await page.getByLabel('Home key').selectOption('');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByTestId('save-state')).toHaveText('Saved.');
	await page.reload();
	await expect(page.getByLabel('Home key')).toHaveValue('');
});

test('a reference recording uploads and plays', async ({ page }) => {
	await signInAsDemoTeacher(page);
	await page.goto(lickUrl);
	await page
		.getByTestId('recording-input')
		.setInputFiles({ name: 'take.wav', mimeType: 'audio/wav', buffer: tinyWav() });
	const audio = page.getByTestId('recording-audio');
	await expect(audio).toBeVisible();
	const played = await audio.evaluate(async (el: HTMLAudioElement) => {
		el.muted = true;
		await el.play();
		await new Promise((resolve) => el.addEventListener('ended', resolve, { once: true }));
		return { duration: el.duration, ended: el.ended };
	});
	expect(played.ended).toBe(true);
	expect(played.duration).toBeCloseTo(0.5, 1);
});

test('the twelve-key sheet prints as a PDF on A4 and US Letter', async ({ page }) => {
	await signInAsDemoTeacher(page);
	await page.goto(lickUrl);
	await page.getByRole('link', { name: 'Print the twelve keys' }).click();
	await expect(page.getByTestId('print-grid').locator('li')).toHaveCount(12);
	await page.getByLabel('Instrument').selectOption('trumpet');
	await page.getByRole('button', { name: 'Write the sheet' }).click();
	await expect(page).toHaveURL(/instrument=trumpet/);
	await expect(page.getByTestId('print-grid').locator('svg')).toHaveCount(12);
	await expect(page.getByText('written for B-flat trumpet', { exact: false })).toBeVisible();
	await shoot(page, 'print-sheet', true);
	await page.emulateMedia({ media: 'print' });
	await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
	await expect(page.getByRole('navigation', { name: 'Main' })).toBeHidden();
	for (const format of ['A4', 'Letter'] as const) {
		const pdf = await page.pdf({ format, preferCSSPageSize: false });
		expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
		// All twelve keys fit on one page for the music stand.
		expect(pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g)?.length).toBe(1);
	}
});

test('importing a file of three tunes makes two licks and reports the broken one', async ({
	page
}) => {
	await signInAsDemoTeacher(page);
	await page.goto('/library/import');
	const file = [
		abc('Imported one', '"F7" f2 a2 c\'2 _e\'2 |]'),
		'',
		'X:2\nT:Imported broken\nK:C\n"C7" c d & e |',
		'',
		abc('Imported three', '"Fm7" f2 _a2 c\'2 _e\'2 |]').replace('X:1', 'X:3')
	].join('\n');
	await page
		.getByLabel('The .abc file')
		.setInputFiles({ name: 'three.abc', mimeType: 'text/plain', buffer: Buffer.from(file) });
	await page.getByRole('button', { name: 'Import' }).click();
	const result = page.getByTestId('import-result');
	await expect(result).toContainText('2 licks made, 1 tune left out');
	await expect(result.getByTestId('import-created')).toHaveCount(2);
	const failed = result.getByTestId('import-failed');
	await expect(failed).toContainText('X:2');
	await expect(failed).toContainText('Imported broken');
	await expect(failed).toContainText('line 12, column 10');
	await shoot(page, 'import-result', true);
});

test('a deck is built and reordered with the keyboard', async ({ page }) => {
	await signInAsDemoTeacher(page);
	await page.goto('/library/decks');
	await page.getByLabel('Name').fill('Evening set');
	await page.getByRole('button', { name: 'Make the deck' }).click();
	await expect(page).toHaveURL(/\/library\/decks\/[0-9a-f-]{36}$/);
	const order = page.getByTestId('deck-order');
	for (const title of ['Evening walk', 'Imported one', 'Imported three']) {
		await page.getByLabel('Find a lick by title or tag').fill(title);
		await page.getByRole('button', { name: 'Find' }).click();
		await page.getByRole('button', { name: `Add “${title}”` }).click();
		await expect(order.getByRole('link', { name: title })).toBeVisible();
	}
	const titles = () => order.getByRole('link').allTextContents();
	expect(await titles()).toEqual(['Evening walk', 'Imported one', 'Imported three']);
	await page.getByRole('button', { name: /Move “Imported three”, position 3/ }).focus();
	await page.keyboard.press('ArrowUp');
	await expect(page.getByTestId('deck-announce')).toHaveText(
		'Moved “Imported three” to position 2 of 3.'
	);
	await page.keyboard.press('Home');
	await expect(page.getByTestId('deck-announce')).toHaveText(
		'Moved “Imported three” to position 1 of 3.'
	);
	await page.reload();
	await expect.poll(titles).toEqual(['Imported three', 'Evening walk', 'Imported one']);
});

test('a public lick’s share link opens for a visitor, who can hear it in another key', async ({
	page,
	browser
}) => {
	// Two browsers, a save and a transposition for a transposing instrument.
	test.slow();
	await signInAsDemoTeacher(page);
	await page.goto(lickUrl);
	await page.getByLabel('Who sees it').selectOption('public');
	await page.getByLabel('Teaching note (Markdown)').fill('Lean on the E♭, the ♭7 of F7.');
	await page.getByRole('button', { name: 'Save changes' }).click();
	const link = page.getByTestId('share-link');
	await expect(link).toBeVisible();
	const href = (await link.getAttribute('href'))!;
	expect(href).toMatch(/^\/s\/[A-Za-z0-9_-]{12}$/);

	const visitor = await browser.newPage();
	await visitor.goto(href);
	await expect(visitor.getByRole('heading', { level: 1 })).toHaveText('Evening walk');
	await expect(visitor.getByTestId('try-result')).toBeVisible();
	await visitor.getByLabel('Key', { exact: true }).selectOption('Bb');
	await visitor.getByLabel('Instrument').selectOption('alto-sax');
	await visitor.getByRole('button', { name: 'Show this key' }).click();
	await expect(visitor.getByTestId('try-result')).toContainText('sounds in B♭');
	// The note's names follow the key on screen: the alto reads concert B♭ as G.
	await expect(visitor.getByTestId('teaching-note')).toHaveText('Lean on the F, the ♭7 of G7.');
	await expect(visitor.getByTestId('note-key')).toContainText('moved to G, the key shown below');
	// The recording is served to anyone holding the link, in byte ranges.
	const src = (await visitor.locator('audio').getAttribute('src'))!;
	const ranged = await visitor.request.get(src, { headers: { range: 'bytes=0-3' } });
	expect(ranged.status()).toBe(206);
	expect((await ranged.body()).toString()).toBe('RIFF');
	await expect(visitor.getByRole('button', { name: 'Play' })).toBeVisible();
	await expect(visitor.getByRole('button', { name: 'Sign in to copy it' })).toBeVisible();
	await visitor.close();
});
