/**
 * The outbox and the sitting kept in IndexedDB, so that grades and the place in a sitting survive
 * a dropped network and a reload. Browser only: import it from `onMount` code.
 */
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { NewOutboxOp, OutboxOp, OutboxStore } from './outbox';
import type { Sitting } from './sitting';
import type { TodayAnswer } from './types';

/** A sitting in progress, resumed when the drill page is opened again the same practice day. */
export interface SavedSitting {
	/** `userId|day`. */
	id: string;
	sittingId: string;
	startedAt: string;
	today: TodayAnswer;
	sitting: Sitting;
}

interface DrillDb extends DBSchema {
	outbox: { key: number; value: OutboxOp; indexes: { byUser: string } };
	sent: { key: string; value: { clientId: string; reviewId: string } };
	sittings: { key: string; value: SavedSitting };
}

let opening: Promise<IDBPDatabase<DrillDb>> | null = null;

function db(): Promise<IDBPDatabase<DrillDb>> {
	opening ??= openDB<DrillDb>('twelvefold-drill', 1, {
		upgrade(database) {
			const outbox = database.createObjectStore('outbox', { keyPath: 'seq', autoIncrement: true });
			outbox.createIndex('byUser', 'userId');
			database.createObjectStore('sent', { keyPath: 'clientId' });
			database.createObjectStore('sittings', { keyPath: 'id' });
		}
	});
	return opening;
}

export class IndexedDbOutboxStore implements OutboxStore {
	async append(op: NewOutboxOp): Promise<number> {
		// The key generator gives each op a place after every op stored before it.
		return (await (await db()).add('outbox', op as OutboxOp)) as number;
	}
	async list(userId: string): Promise<OutboxOp[]> {
		return (await db()).getAllFromIndex('outbox', 'byUser', userId);
	}
	async remove(seq: number): Promise<void> {
		await (await db()).delete('outbox', seq);
	}
	async reviewIdOf(clientId: string): Promise<string | null> {
		return (await (await db()).get('sent', clientId))?.reviewId ?? null;
	}
	async rememberReviewId(clientId: string, reviewId: string): Promise<void> {
		await (await db()).put('sent', { clientId, reviewId });
	}
}

export async function loadSitting(id: string): Promise<SavedSitting | undefined> {
	return (await db()).get('sittings', id);
}

export async function saveSitting(saved: SavedSitting): Promise<void> {
	// Svelte state is a proxy; IndexedDB's structured clone wants plain data.
	await (await db()).put('sittings', JSON.parse(JSON.stringify(saved)));
}

export async function forgetSitting(id: string): Promise<void> {
	await (await db()).delete('sittings', id);
}
