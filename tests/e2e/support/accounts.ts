import { execFileSync } from 'node:child_process';
import { expect, type APIRequestContext, type Page } from '@playwright/test';
import { E2E_DATA_DIR } from './env';
import { newestMailTo } from './outbox';

export type Role = 'learner' | 'teacher';
export interface Account {
	email: string;
	password: string;
	name: string;
	role: Role;
}

let counter = 0;

/** A fresh, unique account (the data folder is wiped per run, so addresses never collide). */
export function newAccount(
	role: Role,
	name = role === 'teacher' ? 'Tess Marlow' : 'Lou Pardee'
): Account {
	counter += 1;
	return {
		email: `${role}-${process.pid}-${counter}@example.test`,
		password: 'swing-eighths-42',
		name,
		role
	};
}

/** Create the account through the JSON API (for tests whose subject is not sign-up). */
export async function signUpViaApi(request: APIRequestContext, account: Account): Promise<void> {
	const res = await request.post('/api/auth/sign-up', { data: account });
	expect(res.status(), await res.text()).toBe(201);
}

/** Sign in through the JSON API; the session cookie lands in the page's browser context. */
export async function signInViaApi(page: Page, account: Account): Promise<void> {
	const res = await page.request.post('/api/auth/sign-in', {
		data: { email: account.email, password: account.password }
	});
	expect(res.status(), await res.text()).toBe(200);
}

/** A fresh account of `role`, signed up and signed in in `page`: the start of most tests. */
export async function signInAsNew(
	page: Page,
	request: APIRequestContext,
	role: Role
): Promise<Account> {
	const account = newAccount(role);
	await signUpViaApi(request, account);
	await signInViaApi(page, account);
	return account;
}

/** Make an existing account an admin with the project's own CLI (`npm run admin -- promote`). */
export function promoteToAdmin(email: string): void {
	execFileSync(process.execPath, ['--import', 'tsx', 'scripts/admin.ts', 'promote', email], {
		env: { ...process.env, DATA_DIR: E2E_DATA_DIR },
		stdio: 'pipe'
	});
}

/**
 * A fresh account made admin with the CLI and signed in in `page`. Its sign-up mail is in the
 * outbox once this returns, so the outbox screens have a message of the admin's own to show.
 */
export async function signInAsNewAdmin(
	page: Page,
	request: APIRequestContext,
	name = 'Ada Quill'
): Promise<Account> {
	const admin = newAccount('learner', name);
	await signUpViaApi(request, admin);
	promoteToAdmin(admin.email);
	await signInViaApi(page, admin);
	await newestMailTo(admin.email);
	return admin;
}
