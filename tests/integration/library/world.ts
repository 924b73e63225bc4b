import path from 'node:path';
import type { SessionUser } from '../../../src/lib/server/auth/session';
import {
	Assignment,
	ClassGroup,
	ClassMember,
	User,
	type Role
} from '../../../src/lib/server/db/models/index';
import { LocalFolderStore } from '../../../src/lib/server/storage/local';
import { setBlobStore } from '../../../src/lib/server/storage/index';
import { openTestWorld, type TestWorld } from '../support/world';

/**
 * A library world: a teacher with a class, a learner in it, a stranger, each a session user the
 * endpoints can be called as; uploads go to a folder inside the test's DATA_DIR.
 */
export interface LibraryWorld extends TestWorld {
	teacher: SessionUser;
	learner: SessionUser;
	stranger: SessionUser;
	classId: string;
	assign(deckId: string): Promise<void>;
}

export async function openLibraryWorld(): Promise<LibraryWorld> {
	const world = await openTestWorld();
	setBlobStore(new LocalFolderStore(path.join(world.dataDir, 'uploads')));
	const make = async (email: string, name: string, role: Role): Promise<SessionUser> => {
		const row = await User.create({
			email,
			name,
			role,
			passwordHash: 'not-a-hash',
			emailVerifiedAt: new Date()
		});
		return {
			id: row.id,
			email,
			name,
			role,
			emailVerified: true,
			settings: {} as SessionUser['settings']
		};
	};
	const teacher = await make('rosa@example.test', 'Rosa', 'teacher');
	const learner = await make('theo@example.test', 'Theo', 'learner');
	const stranger = await make('nell@example.test', 'Nell', 'teacher');
	const group = await ClassGroup.create({ teacherId: teacher.id, name: 'Tuesday combo' });
	await ClassMember.create({ classId: group.id, userId: learner.id, joinedAt: new Date() });
	return {
		...world,
		teacher,
		learner,
		stranger,
		classId: group.id,
		async assign(deckId: string) {
			await Assignment.create({ classId: group.id, deckId, startDate: '2026-12-01', newPerDay: 3 });
		},
		async close() {
			setBlobStore(null);
			await world.close();
		}
	};
}

// Each endpoint types its own event; this fake fits them all.
type Handler = (event: never) => Response | Promise<Response>;

export interface CallInput {
	params?: Record<string, string>;
	query?: Record<string, string>;
	body?: unknown;
	/** Raw bytes or form data instead of JSON. */
	raw?: BodyInit;
	headers?: Record<string, string>;
	method?: string;
}

/** Call an endpoint handler as `user` (null: signed out) and read its answer. */
export async function call(handler: Handler, user: SessionUser | null, input: CallInput = {}) {
	const url = new URL('http://twelvefold.test/api/x');
	for (const [k, v] of Object.entries(input.query ?? {})) url.searchParams.set(k, v);
	const headers = new Headers(input.headers ?? {});
	let body: BodyInit | undefined = input.raw;
	if (input.body !== undefined) {
		headers.set('content-type', 'application/json');
		body = JSON.stringify(input.body);
	}
	const method = input.method ?? (body === undefined ? 'GET' : 'POST');
	const request = new Request(url, { method, headers, body });
	const event = {
		request,
		url,
		params: input.params ?? {},
		locals: { user, session: null },
		getClientAddress: () => '203.0.113.9'
	};
	const response = await handler(event as never);
	const type = response.headers.get('content-type') ?? '';
	const data = type.includes('json') ? await response.json() : await response.text();
	return { status: response.status, data, headers: response.headers };
}

/** A tiny valid wav: 44-byte RIFF header and `samples` bytes of 8-bit silence. */
export function tinyWav(samples = 64): Uint8Array<ArrayBuffer> {
	const buf = Buffer.alloc(44 + samples);
	buf.write('RIFF', 0);
	buf.writeUInt32LE(36 + samples, 4);
	buf.write('WAVE', 8);
	buf.write('fmt ', 12);
	buf.writeUInt32LE(16, 16);
	buf.writeUInt16LE(1, 20); // PCM
	buf.writeUInt16LE(1, 22); // mono
	buf.writeUInt32LE(8000, 24);
	buf.writeUInt32LE(8000, 28);
	buf.writeUInt16LE(1, 32);
	buf.writeUInt16LE(8, 34);
	buf.write('data', 36);
	buf.writeUInt32LE(samples, 40);
	buf.fill(128, 44);
	return new Uint8Array(
		buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength)
	) as Uint8Array<ArrayBuffer>;
}

export const lickAbc = (title: string, body = '"C7" c d e g _b a g e | c4 z4 |]') =>
	`X:1\nT:${title}\nM:4/4\nL:1/8\nQ:1/4=120\nK:C\n${body}`;
