import { execFileSync } from 'node:child_process';
import { expect, test, type Page } from '@playwright/test';
import { newAccount } from './support/accounts';
import { E2E_DATA_DIR } from './support/env';
import { linkIn, newestMailTo } from './support/outbox';

/**
 * A class from the teacher's first click to the learner's drill: create, assign a deck at a pace
 * in six keys, invite by e-mail; the invited person signs up from the mail and lands in the
 * class; today's drill brings the deck's licks in those keys only; the teacher sees the learner
 * in the progress table, opens the heat map and comments; the learner's next prompt of that lick
 * carries the comment.
 */

const SIX_KEYS = ['C', 'F', 'Bb', 'Eb', 'Ab', 'Db'];
const DECK = 'First steps over the dominant';
const shots = process.env.SCREENSHOTS ? 'docs/screenshots' : null;

test.beforeAll(() => {
	// The demo school (teacher, decks, demo class and its simulated history) in the served database.
	execFileSync(process.execPath, ['--import', 'tsx', 'scripts/seed.ts'], {
		env: { ...process.env, DATA_DIR: E2E_DATA_DIR, DEMO_PASSWORD: 'demo-password-12' },
		stdio: 'pipe'
	});
});

async function signInAsDemoTeacher(page: Page) {
	const res = await page.request.post('/api/auth/sign-in', {
		data: { email: 'teacher@example.com', password: 'demo-password-12' }
	});
	expect(res.status(), await res.text()).toBe(200);
}

function yesterday(): string {
	return new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
}

test('a teacher runs a class from invitation to a comment the learner reads in the drill', async ({
	page,
	browser
}) => {
	test.setTimeout(120_000);
	await signInAsDemoTeacher(page);

	await page.goto('/teach/classes');
	await page.getByLabel('Class name').fill('Thursday horns');
	await page.getByRole('button', { name: 'Create class' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Thursday horns' })).toBeVisible();

	// A deck at four new licks a day, in six keys only.
	await page.locator('select[name=deckId]').selectOption({ label: `${DECK} (4 licks)` });
	await page.getByLabel('Start date').fill(yesterday());
	await page.getByLabel('New licks a day').fill('4');
	await page.getByLabel('Only these').check();
	for (const key of SIX_KEYS) {
		await page.getByLabel(key.replace('b', '♭'), { exact: true }).check();
	}
	await page.getByRole('button', { name: 'Assign', exact: true }).click();
	await expect(page.getByText(`${DECK} assigned.`)).toBeVisible();
	await expect(page.getByRole('region', { name: 'Assigned decks' })).toContainText(
		/keys:\s+C Db Eb F Ab Bb/
	);

	// Invite someone who has no account yet.
	const newcomer = newAccount('learner', 'Nia Brightwater');
	await page.getByLabel('Invite by e-mail').fill(newcomer.email);
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByText(`Invitation sent to ${newcomer.email}.`)).toBeVisible();

	const mail = await newestMailTo(newcomer.email);
	expect(mail.subject).toBe('Rosa Delgado-Finch invites you to Thursday horns on Twelvefold');
	const link = linkIn(mail, '/join');

	// The newcomer signs up from the mail and lands in the class.
	const context = await browser.newContext();
	const learner = await context.newPage();
	await learner.goto(link.pathname + link.search);
	await expect(learner.getByRole('heading', { name: 'Join Thursday horns' })).toBeVisible();
	await learner.getByRole('link', { name: 'Make an account and join' }).click();
	await expect(
		learner.getByText('Once your account is made you are in the class Thursday horns.')
	).toBeVisible();
	await learner.getByLabel('Your name').fill(newcomer.name);
	await learner.getByLabel('E-mail address').fill(newcomer.email);
	await learner.getByLabel('Password').fill(newcomer.password);
	await learner.getByRole('button', { name: 'Create my account' }).click();
	await expect(learner).toHaveURL(/\/classes\?joined=/);
	await expect(learner.getByText('You are in Thursday horns.')).toBeVisible();
	await expect(learner.getByText(DECK)).toBeVisible();

	// Today's drill: the deck's four licks, new, each in one of the six keys.
	const today = await (await learner.request.get('/api/drill/today')).json();
	const items = today.items as {
		cardId: string;
		title: string;
		key: string;
		quality: string;
		isNew: boolean;
		comments: { text: string }[];
	}[];
	expect(items.filter((i) => i.isNew)).toHaveLength(4);
	for (const item of items) expect(SIX_KEYS).toContain(item.key);
	const [first, second] = items;
	const graded = await learner.request.post('/api/drill/reviews', {
		data: {
			cardId: first.cardId,
			key: first.key,
			quality: first.quality,
			grade: 3,
			clientId: 'e2e-first',
			revealMs: 20000,
			gradeMs: 3000
		}
	});
	expect(graded.status(), await graded.text()).toBe(201);

	// The teacher sees the newcomer in the progress table.
	await page.reload();
	const row = page.getByTestId('progress-table').getByRole('row', { name: /Nia Brightwater/ });
	await expect(row).toBeVisible();
	await expect(row.getByRole('cell').nth(1)).toHaveText('1');

	// The heat map, and a comment on the lick not yet played.
	await row.getByRole('link', { name: 'Nia Brightwater' }).click();
	await expect(page.getByTestId('heat-map')).toBeVisible();
	await expect(page.getByTestId('heat-map').getByRole('columnheader')).toHaveCount(14);
	await page.getByTestId('heat-map').getByRole('link', { name: second.title }).click();
	await expect(page.getByRole('heading', { name: `Comments on ${second.title}` })).toBeVisible();
	const text = 'Sing it once in E♭ before you play it, then let the ladder take the tempo up.';
	await page.getByLabel('Your comment').fill(text);
	await page.getByRole('button', { name: 'Send comment' }).click();
	await expect(page.getByTestId('thread')).toContainText(text);

	// At the learner's next prompt of that lick the comment comes with it.
	const again = await (await learner.request.get('/api/drill/today')).json();
	const prompt = (again.items as typeof items).find((i) => i.cardId === second.cardId);
	expect(prompt?.comments.map((c) => c.text)).toEqual([text]);
	await context.close();
});

test('the demo class shows three learners with history, a heat map and a comment thread', async ({
	page
}) => {
	await signInAsDemoTeacher(page);
	await page.goto('/teach/classes');
	await page.getByRole('link', { name: 'Tuesday evening combo' }).first().click();
	const table = page.getByTestId('progress-table');
	await expect(table.getByRole('row')).toHaveCount(4);
	if (shots) await page.screenshot({ path: `${shots}/class-progress.png`, fullPage: false });
	await table.getByRole('link', { name: 'Ines Kowal' }).click();
	await expect(page.getByTestId('heat-map')).toBeVisible();
	if (shots) await page.screenshot({ path: `${shots}/heat-map.png`, fullPage: false });
	await page.setViewportSize({ width: 390, height: 844 });
	if (shots) await page.screenshot({ path: `${shots}/heat-map-mobile.png`, fullPage: false });
	await page.setViewportSize({ width: 1280, height: 800 });
	// Sam's thread: the teacher's note on a key he dodges, and his answer.
	await page.goto('/teach/classes');
	await page.getByRole('link', { name: 'Tuesday evening combo' }).first().click();
	await page.getByTestId('progress-table').getByRole('link', { name: 'Sam Adeyemi' }).click();
	const commented = page.getByTestId('heat-map').getByRole('row').filter({ hasText: 'comments' });
	await commented.getByRole('link').click();
	await expect(page.getByTestId('thread').getByRole('listitem')).toHaveCount(2);
	await page.locator('#thread').scrollIntoViewIfNeeded();
	if (shots) await page.locator('#thread').screenshot({ path: `${shots}/class-comment.png` });
});
