import path from 'node:path';
import type { RequestEvent } from '@sveltejs/kit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkHealth } from '$lib/server/admin/health';
import { countUsersByRole, listUsers } from '$lib/server/admin/users';
import type { SessionUser } from '$lib/server/auth/session';
import { closeDb, openDb } from '$lib/server/db/index';
import { migrate } from '$lib/server/db/migrate';
import { User } from '$lib/server/db/models/index';
import { sendMail, startMail, stopMail } from '$lib/server/mail';
import { listMessages } from '$lib/server/mail/outbox';
import { verificationMail } from '$lib/server/mail/templates';
import { GET as getHealth } from '../../../src/routes/api/admin/health/+server';
import { GET as getOutbox } from '../../../src/routes/api/admin/outbox/+server';
import { GET as getOutboxMessage } from '../../../src/routes/api/admin/outbox/[id]/+server';
import { useTempDataDir } from '../support/mail';

let data: Awaited<ReturnType<typeof useTempDataDir>>;

beforeAll(async () => {
	data = await useTempDataDir();
	const db = openDb(`sqlite:${path.join(data.dir, 'admin.sqlite')}`);
	await migrate(db);
	// Distinct creation times so "newest first" has one right answer.
	const people = [
		['lee@example.com', 'Lee', 'learner'],
		['max@example.com', 'Max', 'learner'],
		['tia@example.com', 'Tia', 'teacher'],
		['ana@example.com', 'Ana', 'admin']
	] as const;
	for (const [i, [email, name, role]] of people.entries()) {
		const at = new Date(Date.UTC(2026, 10, 1 + i));
		await User.create({
			email,
			name,
			role,
			passwordHash: 'not-a-real-hash',
			createdAt: at,
			updatedAt: at
		});
	}
	await startMail();
	await sendMail({
		to: 'lee@example.com',
		...verificationMail({ url: 'http://localhost:3000/verify?token=l1' })
	});
	await sendMail({
		to: 'max@example.com',
		...verificationMail({ url: 'http://localhost:3000/verify?token=m1' })
	});
});

afterAll(async () => {
	await stopMail();
	await closeDb();
	await data.cleanup();
});

function userWith(role: SessionUser['role']): SessionUser {
	return {
		id: `id-${role}`,
		email: `${role}@example.com`,
		name: role,
		role,
		emailVerified: true,
		settings: {} as SessionUser['settings']
	};
}

// Each endpoint types its own event; the fake event below fits them all.
type Handler = (event: never) => Response | Promise<Response>;

async function call(
	handler: Handler,
	user: SessionUser | null,
	url: string,
	params: Record<string, string> = {}
) {
	const event = {
		locals: { user, session: null },
		url: new URL(url),
		params
	} as unknown as RequestEvent;
	const response = await handler(event as never);
	return { status: response.status, body: await response.json() };
}

describe('admin account queries', () => {
	it('counts accounts by role, every role present', async () => {
		expect(await countUsersByRole()).toEqual({ learner: 2, teacher: 1, admin: 1 });
	});

	it('lists accounts newest first as plain rows without password hashes', async () => {
		const users = await listUsers();
		expect(users.map((u) => u.email)).toEqual([
			'ana@example.com',
			'tia@example.com',
			'max@example.com',
			'lee@example.com'
		]);
		expect(users[0]).toEqual({
			id: expect.any(String),
			name: 'Ana',
			email: 'ana@example.com',
			role: 'admin',
			emailVerified: false,
			createdAt: '2026-11-04T00:00:00.000Z'
		});
		expect(await listUsers({ limit: 1 })).toHaveLength(1);
	});
});

describe('the health check', () => {
	it('reports a reachable database, the local mail stand-in and the outbox count', async () => {
		const health = await checkHealth(new Date('2026-12-01T12:00:00Z'));
		expect(health).toEqual({
			ok: true,
			database: { ok: true, dialect: 'sqlite' },
			mail: { mode: 'local', port: expect.any(Number), outboxDir: data.outbox },
			outboxCount: 2,
			uptimeSeconds: expect.any(Number),
			checkedAt: '2026-12-01T12:00:00.000Z'
		});
	});
});

describe('the admin JSON API', () => {
	const base = 'http://localhost:3000/api/admin';
	const endpoints: [string, Handler, string, Record<string, string>][] = [
		['GET /api/admin/outbox', getOutbox, `${base}/outbox`, {}],
		[
			'GET /api/admin/outbox/:id',
			getOutboxMessage,
			`${base}/outbox/x`,
			{ id: '19990101T000000000Z-000000' }
		],
		['GET /api/admin/health', getHealth, `${base}/health`, {}]
	];

	it.each(endpoints)(
		'%s answers 401 without a session and 403 to learners and teachers',
		async (_name, handler, url, params) => {
			expect(await call(handler, null, url, params)).toEqual({
				status: 401,
				body: { error: { message: expect.stringContaining('Sign in') } }
			});
			for (const role of ['learner', 'teacher'] as const) {
				expect(await call(handler, userWith(role), url, params)).toEqual({
					status: 403,
					body: { error: { message: 'This endpoint is for admin accounts.' } }
				});
			}
		}
	);

	it('lists the outbox newest first for an admin', async () => {
		const { status, body } = await call(getOutbox, userWith('admin'), `${base}/outbox`);
		expect(status).toBe(200);
		expect(body.total).toBe(2);
		expect(body.messages.map((m: { to: string }) => m.to)).toEqual([
			'max@example.com',
			'lee@example.com'
		]);
		expect(body.messages[0]).toEqual({
			id: expect.any(String),
			from: expect.any(String),
			to: 'max@example.com',
			subject: 'Confirm your e-mail address for Twelvefold',
			date: expect.any(String),
			receivedAt: expect.stringMatching(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/)
		});
	});

	it('honours a limit and refuses a malformed one with 400', async () => {
		const one = await call(getOutbox, userWith('admin'), `${base}/outbox?limit=1`);
		expect([one.status, one.body.messages.length, one.body.total]).toEqual([200, 1, 2]);
		for (const bad of ['0', '-1', 'ten', '1.5', '', '99999']) {
			const answer = await call(getOutbox, userWith('admin'), `${base}/outbox?limit=${bad}`);
			expect(answer).toEqual({
				status: 400,
				body: {
					error: { message: `limit ${JSON.stringify(bad)} must be a whole number from 1 to 1000.` }
				}
			});
		}
	});

	it('returns one message with its verification link for an admin', async () => {
		const [newest] = await listMessages();
		const { status, body } = await call(
			getOutboxMessage,
			userWith('admin'),
			`${base}/outbox/${newest.id}`,
			{ id: newest.id }
		);
		expect(status).toBe(200);
		expect(body).toMatchObject({
			id: newest.id,
			to: 'max@example.com',
			links: ['http://localhost:3000/verify?token=m1']
		});
		expect(body.text).toContain('Hello,');
		expect(body.html).toContain('Confirm my address');
	});

	it.each(['../../etc/passwd', '19990101T000000000Z-000000', 'nope'])(
		'answers 404 with a message for the id %j',
		async (id) => {
			const { status, body } = await call(getOutboxMessage, userWith('admin'), `${base}/outbox/x`, {
				id
			});
			expect(status).toBe(404);
			expect(body.error.message).toMatch(/^No message .* in the outbox/);
		}
	);

	it('answers health with 200 for an admin', async () => {
		const { status, body } = await call(getHealth, userWith('admin'), `${base}/health`);
		expect(status).toBe(200);
		expect(body).toMatchObject({
			ok: true,
			database: { ok: true },
			mail: { mode: 'local' },
			outboxCount: 2
		});
	});
});
