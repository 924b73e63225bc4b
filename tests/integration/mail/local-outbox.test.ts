import { readFile, readdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getMailStatus, sendMail, startMail, stopMail } from '$lib/server/mail';
import { countMessages, listMessages, readMessage } from '$lib/server/mail/outbox';
import { passwordResetMail, renderMail } from '$lib/server/mail/templates';
import { useTempDataDir } from '../support/mail';

let data: Awaited<ReturnType<typeof useTempDataDir>>;

beforeAll(async () => {
	data = await useTempDataDir();
	await startMail();
});

afterAll(async () => {
	await stopMail();
	await data.cleanup();
});

const hostileName = '<script>alert("pwned")</script> & Sons';
const verifyUrl = 'http://localhost:3000/verify?token=abc123&next=%2Fhome';

async function emlFiles(): Promise<string[]> {
	return (await readdir(data.outbox)).filter((name) => name.endsWith('.eml')).sort();
}

describe('the local SMTP stand-in', () => {
	it('starts once on a loopback port however often startMail is called', async () => {
		const first = getMailStatus();
		await Promise.all([startMail(), startMail(), startMail()]);
		expect(first.mode).toBe('local');
		expect(getMailStatus()).toEqual(first);
		expect(first).toMatchObject({ outboxDir: data.outbox });
	});

	it('stores a sent mail as an .eml file with both parts and the name escaped only in HTML', async () => {
		const before = await emlFiles();
		await sendMail({
			to: 'ada@example.com',
			...passwordResetMail({ name: hostileName, url: verifyUrl })
		});
		const after = await emlFiles();
		expect(after).toHaveLength(before.length + 1);
		const newest = after[after.length - 1];
		expect(newest).toMatch(/^\d{8}T\d{9}Z-[0-9a-f]{6}\.eml$/);

		const parsed = await simpleParser(await readFile(path.join(data.outbox, newest)));
		expect(parsed.subject).toBe('Choose a new Twelvefold password');
		expect(parsed.to && !Array.isArray(parsed.to) ? parsed.to.text : '').toBe('ada@example.com');
		expect(parsed.from?.text).toContain('no-reply@twelvefold.test');
		const html = String(parsed.html);
		expect(html).not.toContain('<script>');
		expect(html).toContain('&lt;script&gt;alert(&quot;pwned&quot;)&lt;/script&gt; &amp; Sons');
		expect(html).toContain('href="http://localhost:3000/verify?token=abc123&amp;next=%2Fhome"');
		expect(parsed.text).toContain(`Hello ${hostileName},`);
		expect(parsed.text).toContain(verifyUrl);
	});

	it('reads a stored message back with headers, both parts and its links', async () => {
		await sendMail({
			to: 'bo@example.com',
			...passwordResetMail({ name: 'Bo', url: 'http://localhost:3000/reset?token=r1' })
		});
		const [latest] = await listMessages();
		const result = await readMessage(latest.id);
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		const { message } = result;
		expect(message).toMatchObject({
			id: latest.id,
			to: 'bo@example.com',
			subject: 'Choose a new Twelvefold password'
		});
		expect(message.text).toContain('Hello Bo,');
		expect(message.html).toContain('Choose a new password</a>');
		expect(message.links).toEqual(['http://localhost:3000/reset?token=r1']);
		const names = message.headers.map((header) => header.name.toLowerCase());
		expect(names).toEqual(expect.arrayContaining(['from', 'to', 'subject', 'date', 'message-id']));
	});

	it('passes extra headers such as List-Unsubscribe through to the message', async () => {
		const mail = renderMail({
			subject: 'Your drill for today',
			greeting: 'Hello Cy,',
			blocks: [{ kind: 'paragraph', text: 'Three licks are due.' }],
			unsubscribeUrl: 'http://localhost:3000/unsubscribe?t=u9'
		});
		await sendMail({ to: 'cy@example.com', ...mail });
		const [latest] = await listMessages();
		const result = await readMessage(latest.id);
		if (!result.ok) throw new Error(result.error);
		const header = (name: string) =>
			result.message.headers.find((h) => h.name.toLowerCase() === name)?.value;
		expect(header('list-unsubscribe')).toContain('http://localhost:3000/unsubscribe?t=u9');
		expect(header('list-unsubscribe-post')).toBe('List-Unsubscribe=One-Click');
		expect(result.message.text).toContain('Unsubscribe: http://localhost:3000/unsubscribe?t=u9');
	});

	it('lists messages newest first with date, sender, recipient and subject', async () => {
		for (const n of [1, 2, 3]) {
			await sendMail({
				to: `order${n}@example.com`,
				subject: `Order ${n}`,
				html: `<p>${n}</p>`,
				text: `${n}`
			});
		}
		const list = await listMessages();
		expect(list.slice(0, 3).map((m) => [m.to, m.subject])).toEqual([
			['order3@example.com', 'Order 3'],
			['order2@example.com', 'Order 2'],
			['order1@example.com', 'Order 1']
		]);
		const ids = list.map((m) => m.id);
		expect(ids).toEqual([...ids].sort().reverse());
		for (const m of list) {
			expect(Number.isNaN(Date.parse(m.date))).toBe(false);
			// The arrival time is the id's timestamp, to the millisecond.
			expect(m.receivedAt.replace(/[-:.]/g, '')).toBe(m.id.slice(0, 19));
		}
		expect(await countMessages()).toBe(list.length);
		expect(await listMessages({ limit: 2 })).toEqual(list.slice(0, 2));
	});

	it('ignores stray files in the outbox folder', async () => {
		const count = await countMessages();
		await writeFile(path.join(data.outbox, 'notes.txt'), 'not a mail');
		await writeFile(path.join(data.outbox, '..evil.eml'), 'Subject: sneaky\r\n\r\nx');
		expect(await countMessages()).toBe(count);
	});

	it('falls back to the arrival time for a message without a Date header', async () => {
		const id = '20200101T000000000Z-abcdef';
		await writeFile(
			path.join(data.outbox, `${id}.eml`),
			'Subject: no date\r\nTo: x@example.com\r\n\r\nbody\r\n'
		);
		const result = await readMessage(id);
		expect(
			result.ok && [result.message.date, result.message.receivedAt, result.message.text]
		).toEqual(['2020-01-01T00:00:00.000Z', '2020-01-01T00:00:00.000Z', 'body\n']);
		// Oldest by its name, so it lists last.
		expect((await listMessages()).at(-1)?.id).toBe(id);
	});

	it.each([
		['a parent-directory path', '../../etc/passwd'],
		['an encoded traversal', '..%2F..%2Fetc%2Fpasswd'],
		['an id with a path appended', '20261201T215845123Z-3fa9c1/../../x'],
		['an absolute path', '/etc/passwd'],
		['an empty string', ''],
		['a file name with its extension', '20261201T215845123Z-3fa9c1.eml'],
		['a number', 42],
		['nothing', undefined]
	])('rejects %s as an id without touching the disk', async (_label, id) => {
		const result = await readMessage(id);
		expect(result).toMatchObject({ ok: false, reason: 'bad-id' });
		if (!result.ok) expect(result.error).toMatch(/^No message .* in the outbox/);
	});

	it('answers not-found for a well-formed id that has no file', async () => {
		expect(await readMessage('19990101T000000000Z-000000')).toEqual({
			ok: false,
			reason: 'not-found',
			error: 'No message "19990101T000000000Z-000000" in the outbox'
		});
	});

	it.each([
		['a recipient list', { to: 'a@example.com, b@example.com' }],
		['a recipient with a line break', { to: 'a@example.com\r\nBcc: b@example.com' }],
		['a subject with a line break', { subject: 'Hi\r\nBcc: b@example.com' }],
		['a header value with a line break', { headers: { 'X-Note': 'a\r\nBcc: b@example.com' } }],
		['a header name with a colon', { headers: { 'X-Note: y': 'a' } }]
	])('refuses to send %s and stores nothing', async (_label, override) => {
		const count = await countMessages();
		const mail = {
			to: 'ok@example.com',
			subject: 'Fine',
			html: '<p>x</p>',
			text: 'x',
			...override
		};
		await expect(sendMail(mail)).rejects.toThrow(/^Cannot send mail to|^Mail (subject|header)/);
		expect(await countMessages()).toBe(count);
	});
});
