import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { simpleParser, type ParsedMail } from 'mailparser';
import {
	Assignment,
	Card,
	ClassGroup,
	ClassMember,
	Comment,
	Deck,
	Lick,
	Review,
	User
} from '../../../src/lib/server/db/models/index';

/**
 * Rows for the digest tests, written through the shared models as the drill and classes write
 * them. Every value that matters to a test is passed in; the rest has a plain default.
 */

export async function makeUser(fields: {
	email: string;
	name?: string;
	role?: 'learner' | 'teacher' | 'admin';
	timezone?: string;
	digestHour?: number;
	dayStartHour?: number;
	verified?: boolean;
	digestEnabled?: boolean;
}): Promise<User> {
	return User.create({
		email: fields.email,
		name: fields.name ?? fields.email.split('@')[0],
		role: fields.role ?? 'learner',
		passwordHash: 'not-a-real-hash',
		emailVerifiedAt: fields.verified === false ? null : new Date('2026-01-01T00:00:00Z'),
		timezone: fields.timezone ?? 'UTC',
		digestHour: fields.digestHour ?? 7,
		dayStartHour: fields.dayStartHour ?? 4,
		digestEnabled: fields.digestEnabled ?? true,
		settings: { instrument: 'concert', newPerDay: 5 }
	});
}

export async function makeLick(authorId: string, title: string): Promise<Lick> {
	return Lick.create({
		authorId,
		title,
		abc: 'X:1\nK:C\nCDEF|',
		homeKey: 'C',
		homeQuality: '7',
		tempo: 120
	});
}

export async function makeCard(
	userId: string,
	lickId: string,
	fields: {
		state?: number;
		due?: Date;
		quality?: string;
		assignmentId?: string | null;
		introducedDay?: string | null;
		newPosition?: number;
	} = {}
): Promise<Card> {
	return Card.create({
		userId,
		lickId,
		quality: fields.quality ?? '7',
		state: fields.state ?? 0,
		due: fields.due ?? new Date('2026-01-01T00:00:00Z'),
		assignmentId: fields.assignmentId ?? null,
		introducedDay: fields.introducedDay ?? null,
		newPosition: fields.newPosition ?? 0
	});
}

export async function makeReview(
	card: Card,
	fields: {
		day: string;
		grade?: number;
		key?: string;
		at?: Date;
		revealMs?: number;
		gradeMs?: number;
	}
): Promise<Review> {
	return Review.create({
		cardId: card.id,
		userId: card.userId,
		lickId: card.lickId,
		clientId: randomUUID(),
		reviewedAt: fields.at ?? new Date(`${fields.day}T12:00:00Z`),
		day: fields.day,
		grade: fields.grade ?? 3,
		key: fields.key ?? 'C',
		quality: card.quality,
		revealMs: fields.revealMs ?? 20_000,
		gradeMs: fields.gradeMs ?? 4_000,
		stateBefore: '{}',
		stateAfter: '{}'
	});
}

export async function makeClass(
	teacherId: string,
	name: string,
	members: string[]
): Promise<ClassGroup> {
	const group = await ClassGroup.create({ teacherId, name });
	for (const userId of members) {
		await ClassMember.create({
			classId: group.id,
			userId,
			joinedAt: new Date('2026-01-05T00:00:00Z')
		});
	}
	return group;
}

export async function makeAssignment(
	classId: string,
	ownerId: string,
	fields: { deckName: string; startDate: string; newPerDay?: number; createdAt?: Date }
): Promise<{ assignment: Assignment; deck: Deck }> {
	const deck = await Deck.create({ ownerId, name: fields.deckName });
	const assignment = await Assignment.create({
		classId,
		deckId: deck.id,
		startDate: fields.startDate,
		newPerDay: fields.newPerDay ?? 2,
		createdAt: fields.createdAt
	} as never);
	return { assignment, deck };
}

export async function makeComment(
	cardId: string,
	authorId: string,
	text: string,
	createdAt: Date
): Promise<Comment> {
	return Comment.create({ cardId, authorId, text, createdAt } as never);
}

/** Every mail in the local outbox, parsed by mailparser, oldest first. */
export async function readOutbox(dataDir: string): Promise<ParsedMail[]> {
	const dir = path.join(dataDir, 'outbox');
	const names = (await readdir(dir).catch(() => [] as string[]))
		.filter((n) => n.endsWith('.eml'))
		.sort();
	return Promise.all(names.map(async (n) => simpleParser(await readFile(path.join(dir, n)))));
}

/** The addresses a parsed mail went to. */
export function recipientsOf(mail: ParsedMail): string[] {
	const to = mail.to ? (Array.isArray(mail.to) ? mail.to : [mail.to]) : [];
	return to.flatMap((a) => a.value.map((v) => (v.address ?? '').toLowerCase()));
}
