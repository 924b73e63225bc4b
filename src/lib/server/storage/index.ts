import path from 'node:path';
import { getConfig } from '../config';
import { LocalFolderStore } from './local';

/**
 * Where uploaded files live (reference recordings). The interface is small on purpose: an
 * S3-compatible store implements the same four calls with PutObject, HeadObject, GetObject
 * (with a `Range` header) and DeleteObject, and `setBlobStore` swaps it in at start.
 */
export interface BlobStore {
	/** Store `bytes` under `key`, replacing anything there. */
	put(key: string, bytes: Uint8Array, contentType: string): Promise<void>;
	/** Size in bytes, or null when nothing is stored under `key`. */
	size(key: string): Promise<number | null>;
	/**
	 * The bytes from `start` to `end` inclusive (the whole object without a range), as a web
	 * stream; null when nothing is stored under `key`.
	 */
	read(
		key: string,
		range?: { start: number; end: number }
	): Promise<ReadableStream<Uint8Array> | null>;
	/** Remove `key`; removing what is not there is not an error. */
	delete(key: string): Promise<void>;
}

let store: BlobStore | null = null;

/** The store in use: by default a folder `uploads/` under DATA_DIR. */
export function getBlobStore(): BlobStore {
	store ??= new LocalFolderStore(path.join(getConfig().dataDir, 'uploads'));
	return store;
}

/** Replace the store (another backend at start, or a fresh folder in a test); null resets. */
export function setBlobStore(next: BlobStore | null): void {
	store = next;
}
