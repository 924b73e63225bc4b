import fs from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';
import { E2E_DATA_DIR } from './env';

const outbox = path.join(E2E_DATA_DIR, 'outbox');

function recipients(mail: ParsedMail): string[] {
	const to = mail.to ? (Array.isArray(mail.to) ? mail.to : [mail.to]) : [];
	return to.flatMap((a) => a.value.map((v) => (v.address ?? '').toLowerCase()));
}

/**
 * The newest mail filed in the local outbox for `address`, waiting for it to arrive (the app
 * sends through its own SMTP stand-in, which writes `.eml` files a moment later).
 */
export async function newestMailTo(address: string, timeoutMs = 10_000): Promise<ParsedMail> {
	const deadline = Date.now() + timeoutMs;
	const wanted = address.toLowerCase();
	for (;;) {
		const names = await fs.readdir(outbox).catch(() => [] as string[]);
		const files = await Promise.all(
			names
				.filter((n) => n.endsWith('.eml'))
				.map(async (n) => {
					const file = path.join(outbox, n);
					return { file, mtime: (await fs.stat(file)).mtimeMs };
				})
		);
		files.sort((a, b) => b.mtime - a.mtime);
		for (const { file } of files) {
			const mail = await simpleParser(await fs.readFile(file));
			if (recipients(mail).includes(wanted)) return mail;
		}
		if (Date.now() > deadline) {
			throw new Error(`No mail to ${address} in ${outbox} after ${timeoutMs} ms.`);
		}
		await new Promise((r) => setTimeout(r, 200));
	}
}

/** The first link in a mail's text part whose path starts with `pathPrefix`. */
export function linkIn(mail: ParsedMail, pathPrefix: string): URL {
	const text = `${mail.text ?? ''}\n${typeof mail.html === 'string' ? mail.html : ''}`;
	for (const match of text.matchAll(/https?:\/\/[^\s"'<>]+/g)) {
		const url = new URL(match[0].replace(/&amp;/g, '&'));
		if (url.pathname.startsWith(pathPrefix)) return url;
	}
	throw new Error(`No link to ${pathPrefix} in the mail "${mail.subject}".`);
}

/**
 * The newest mail to `address` with `subject`, waiting for it: for mails that may be sent just
 * after the page answered, when an earlier mail to the same address is already in the outbox.
 */
export async function newestMailWithSubject(
	address: string,
	subject: string,
	timeoutMs = 10_000
): Promise<ParsedMail> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const mail = await newestMailTo(address, Math.max(0, deadline - Date.now()));
		if (mail.subject === subject) return mail;
		if (Date.now() > deadline) {
			throw new Error(`No mail "${subject}" to ${address}; the newest is "${mail.subject}".`);
		}
		await new Promise((r) => setTimeout(r, 200));
	}
}
