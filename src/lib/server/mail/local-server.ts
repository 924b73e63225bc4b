import { mkdir, rename, writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';
import { createMessageId } from './message-id';

/**
 * The local stand-in for a mail service: an SMTP server on the loopback interface that accepts
 * every message and files it as an `.eml` in the outbox folder, where the admin pages read it.
 * It never relays anything, and it listens on 127.0.0.1 only, so it cannot become an open relay.
 */

export interface LocalSmtpServer {
	/** The loopback port it listens on (chosen by the OS unless one was asked for). */
	port: number;
	outboxDir: string;
	close(): Promise<void>;
}

export interface LocalSmtpOptions {
	outboxDir: string;
	/** 0 (the default) lets the OS pick a free port. */
	port?: number;
	/** Largest message accepted, in bytes; larger ones are refused with SMTP 552. */
	maxBytes?: number;
}

const defaultMaxBytes = 10 * 1024 * 1024;

/** Write through a temporary name and rename, so a reader never sees half a message. */
async function storeMessage(outboxDir: string, raw: Buffer): Promise<string> {
	const id = createMessageId(Date.now());
	const finalPath = path.join(outboxDir, `${id}.eml`);
	const partialPath = `${finalPath}.partial`;
	await writeFile(partialPath, raw);
	await rename(partialPath, finalPath);
	return id;
}

/**
 * Start the stand-in and resolve once it listens.
 * @example const server = await startLocalSmtpServer({ outboxDir: '/tmp/outbox' }); server.port // e.g. 40123
 */
export async function startLocalSmtpServer(options: LocalSmtpOptions): Promise<LocalSmtpServer> {
	const { outboxDir, port = 0, maxBytes = defaultMaxBytes } = options;
	await mkdir(outboxDir, { recursive: true });

	const server = new SMTPServer({
		authOptional: true,
		// No TLS on loopback: the client is told not to try it (nodemailer `ignoreTLS`).
		disabledCommands: ['STARTTLS'],
		size: maxBytes,
		logger: false,
		banner: 'Twelvefold local outbox',
		onData(stream, _session, callback) {
			const chunks: Buffer[] = [];
			stream.on('data', (chunk: Buffer) => chunks.push(chunk));
			stream.on('error', callback);
			stream.on('end', () => {
				if (stream.sizeExceeded) {
					const error = Object.assign(new Error(`Message exceeds ${maxBytes} bytes`), {
						responseCode: 552
					});
					callback(error);
					return;
				}
				storeMessage(outboxDir, Buffer.concat(chunks)).then(
					(id) => callback(null, `Stored as ${id}`),
					(error: Error) => callback(error)
				);
			});
		}
	});

	await new Promise<void>((resolve, reject) => {
		const onError = (error: Error) => reject(error);
		server.server.once('error', onError);
		server.listen(port, '127.0.0.1', () => {
			server.server.off('error', onError);
			resolve();
		});
	});
	// Later errors (a client dropping mid-session) must not crash the app.
	server.on('error', (error) => console.error('[mail] local SMTP server:', error.message));

	const address = server.server.address() as AddressInfo;
	return {
		port: address.port,
		outboxDir,
		close: () => new Promise<void>((resolve) => server.close(() => resolve()))
	};
}
