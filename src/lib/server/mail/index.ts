import type { Transporter } from 'nodemailer';
import { getConfig } from '../config';
import { startLocalSmtpServer, type LocalSmtpServer } from './local-server';
import { outboxDir } from './outbox';
import { createMailTransport, describeSmtpUrl } from './transport';

/**
 * Sending mail. With `SMTP_URL` set, mail goes to that service; without it, `startMail` starts
 * the local stand-in once and every mail lands in `DATA_DIR/outbox/`. The rest of the app only
 * calls `sendMail` with a rendered template (`./templates`).
 */

export interface MailInput {
	to: string;
	subject: string;
	html: string;
	text: string;
	/** Extra headers such as `List-Unsubscribe` (the digest templates set them). */
	headers?: Record<string, string>;
}

/** A mail that cannot be sent as asked; the message names the bad value. */
export class MailError extends Error {
	name = 'MailError';
}

export type MailStatus =
	| { mode: 'stopped' }
	| { mode: 'local'; port: number; outboxDir: string }
	| { mode: 'smtp'; server: string };

interface Running {
	transport: Transporter;
	status: MailStatus;
	local: LocalSmtpServer | null;
}

let running: Running | null = null;
let starting: Promise<Running> | null = null;

async function start(): Promise<Running> {
	const { smtpUrl } = getConfig();
	if (smtpUrl) {
		return {
			transport: createMailTransport({ mode: 'smtp', url: smtpUrl }),
			status: { mode: 'smtp', server: describeSmtpUrl(smtpUrl) },
			local: null
		};
	}
	const local = await startLocalSmtpServer({ outboxDir: outboxDir() });
	return {
		transport: createMailTransport({ mode: 'local', port: local.port }),
		status: { mode: 'local', port: local.port, outboxDir: local.outboxDir },
		local
	};
}

/**
 * Make mail ready: connect to SMTP_URL's service, or start the local stand-in. Calling it again,
 * even while a first call is still starting, reuses the same server.
 * @example await startMail(); getMailStatus() // { mode: 'local', port: 40123, outboxDir: '…/outbox' }
 */
export async function startMail(): Promise<void> {
	if (running) return;
	starting ??= start().then(
		(ready) => {
			running = ready;
			return ready;
		},
		(error) => {
			starting = null;
			throw error;
		}
	);
	await starting;
}

/** Stop the local stand-in and close the transport (tests, and a clean shutdown). */
export async function stopMail(): Promise<void> {
	const current = running ?? (starting ? await starting.catch(() => null) : null);
	running = null;
	starting = null;
	if (!current) return;
	current.transport.close();
	await current.local?.close();
}

/** How mail is being sent right now, for the health page. */
export function getMailStatus(): MailStatus {
	return running?.status ?? { mode: 'stopped' };
}

const headerNamePattern = /^[A-Za-z0-9][A-Za-z0-9-]*$/;

function checkInput(mail: MailInput): void {
	if (typeof mail.to !== 'string' || !/^[^\s@<>,]+@[^\s@<>,]+$/.test(mail.to)) {
		throw new MailError(`Cannot send mail to ${JSON.stringify(mail.to)}: not one e-mail address`);
	}
	if (/[\r\n]/.test(mail.subject)) {
		throw new MailError(`Mail subject ${JSON.stringify(mail.subject)} spans lines`);
	}
	for (const [name, value] of Object.entries(mail.headers ?? {})) {
		// A line break in a header would let a value smuggle in headers of its own.
		if (!headerNamePattern.test(name) || /[\r\n]/.test(value)) {
			throw new MailError(
				`Mail header ${JSON.stringify(name)}: ${JSON.stringify(value)} is not allowed`
			);
		}
	}
}

/** A pooled sender for many mails in a row, apart from the transport web requests use. */
export interface BulkMailer {
	send(mail: MailInput): Promise<void>;
	close(): void;
}

/**
 * Open a pooled transport to the same service `sendMail` uses (the local stand-in is started
 * first when needed). The scheduled mails go through their own pool, so that a batch of digests
 * waiting on a slow service never queues a sign-up's verification mail behind it.
 * @example const bulk = await openBulkMailer(); await bulk.send(mail); bulk.close()
 */
export async function openBulkMailer(
	options: { maxConnections?: number } = {}
): Promise<BulkMailer> {
	await startMail();
	const { status } = running!;
	const pool = { maxConnections: options.maxConnections ?? 3 };
	const { smtpUrl, mailFrom } = getConfig();
	const transport =
		status.mode === 'local'
			? createMailTransport({ mode: 'local', port: status.port }, { pool })
			: createMailTransport({ mode: 'smtp', url: smtpUrl! }, { pool });
	return {
		async send(mail) {
			checkInput(mail);
			await transport.sendMail({
				from: mailFrom,
				to: mail.to,
				subject: mail.subject,
				html: mail.html,
				text: mail.text,
				headers: mail.headers
			});
		},
		close: () => transport.close()
	};
}

/**
 * Send one mail from MAIL_FROM, starting mail first when nobody has yet.
 * @example await sendMail({ to: 'ada@example.com', ...verificationMail({ name: 'Ada', url }) })
 */
export async function sendMail(mail: MailInput): Promise<void> {
	checkInput(mail);
	await startMail();
	const { transport } = running!;
	await transport.sendMail({
		from: getConfig().mailFrom,
		to: mail.to,
		subject: mail.subject,
		html: mail.html,
		text: mail.text,
		headers: mail.headers
	});
}
