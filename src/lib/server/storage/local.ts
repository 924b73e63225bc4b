import { createReadStream } from 'node:fs';
import { mkdir, rename, rm, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { Readable } from 'node:stream';
import type { BlobStore } from './index';

/** Keys are our own (`recordings/<lick>/<random>.wav`); anything else is refused, not resolved. */
const SAFE_KEY = /^[a-z0-9][a-z0-9/_.-]{0,199}$/i;

/** A `BlobStore` over a local folder: one file per key. */
export class LocalFolderStore implements BlobStore {
	constructor(readonly root: string) {}

	private fileOf(key: string): string {
		if (!SAFE_KEY.test(key) || key.split('/').some((part) => part === '..' || part === '.')) {
			throw new Error(`Refused storage key ${JSON.stringify(key)}`);
		}
		return path.join(this.root, key);
	}

	async put(key: string, bytes: Uint8Array): Promise<void> {
		const file = this.fileOf(key);
		await mkdir(path.dirname(file), { recursive: true });
		// Write aside and rename: a reader never sees half a file.
		const partial = `${file}.partial-${process.pid}-${Date.now()}`;
		await writeFile(partial, bytes);
		await rename(partial, file);
	}

	async size(key: string): Promise<number | null> {
		try {
			const s = await stat(this.fileOf(key));
			return s.isFile() ? s.size : null;
		} catch {
			return null;
		}
	}

	async read(
		key: string,
		range?: { start: number; end: number }
	): Promise<ReadableStream<Uint8Array> | null> {
		if ((await this.size(key)) === null) return null;
		const stream = createReadStream(this.fileOf(key), range ?? {});
		return Readable.toWeb(stream) as ReadableStream<Uint8Array>;
	}

	async delete(key: string): Promise<void> {
		await rm(this.fileOf(key), { force: true });
	}
}
