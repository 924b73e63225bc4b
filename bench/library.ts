/**
 * The lick library under load: listing and searching a library of 5,000 licks (server time per
 * page, through the same service the API calls) and importing a 200-tune file. Yardsticks from
 * the same run: a bare `SELECT … LIMIT 25` on the same table (what any listing costs at least),
 * and the engine's strict parse of the 200 tunes alone (what any import costs at least).
 */
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { resetConfig } from '../src/lib/server/config';
import { closeDb, openDb } from '../src/lib/server/db/index';
import { migrate } from '../src/lib/server/db/migrate';
import { Lick, LickTag, User } from '../src/lib/server/db/models/index';
import { importAbcFile } from '../src/lib/server/library/import';
import { listLicks } from '../src/lib/server/library/licks';
import { prepareLick } from '../src/lib/music/engine';
import { splitTunes } from '../src/lib/library/abc-file';
import { DEMO_LICKS } from '../src/lib/demo/licks';

const LICKS = 5000;
const TUNES = 200;

/** Median and fastest milliseconds of `runs` awaited calls after two warm-ups. */
async function time(
	fn: () => Promise<unknown>,
	runs = 15
): Promise<{ median: number; fastest: number }> {
	await fn();
	await fn();
	const times: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t0 = performance.now();
		await fn();
		times.push(performance.now() - t0);
	}
	times.sort((a, b) => a - b);
	return { median: times[Math.floor(times.length / 2)], fastest: times[0] };
}

export async function benchLibrary(): Promise<string[]> {
	const dir = await mkdtemp(path.join(os.tmpdir(), 'twelvefold-bench-'));
	process.env.DATA_DIR = dir;
	resetConfig();
	const db = openDb(`sqlite:${path.join(dir, 'bench.sqlite')}`);
	try {
		await migrate(db);
		const author = await User.create({
			email: 'bench@example.test',
			name: 'Bench',
			role: 'teacher',
			passwordHash: 'x'
		});
		const actor = { id: author.id, role: 'teacher' as const };
		// 5,000 licks from the demo lines, with their tags, written in bulk (storage, not the subject).
		const qualities = ['7', 'm7', 'maj7', 'm7b5', '7alt'];
		const keys = ['C', 'F', 'Bb', 'Eb', 'G', 'D'];
		const rows = Array.from({ length: LICKS }, (_, i) => {
			const demo = DEMO_LICKS[i % DEMO_LICKS.length];
			return {
				authorId: author.id,
				title: `${demo.title} ${i}`,
				abc: demo.abc,
				homeKey: keys[i % keys.length],
				homeQuality: qualities[i % qualities.length],
				note: demo.note,
				tempo: 100 + (i % 120),
				visibility: 'private' as const,
				updatedAt: new Date(Date.UTC(2026, 0, 1) + i * 60_000)
			};
		});
		for (let i = 0; i < rows.length; i += 500) {
			const made = await Lick.bulkCreate(rows.slice(i, i + 500));
			await LickTag.bulkCreate(
				made.flatMap((l, j) =>
					DEMO_LICKS[(i + j) % DEMO_LICKS.length].devices.map((tag) => ({ lickId: l.id, tag }))
				)
			);
		}

		const floor = await time(() =>
			db.query(
				'SELECT id, title FROM licks WHERE author_id = :a ORDER BY updated_at DESC LIMIT 25',
				{
					replacements: { a: author.id },
					type: QueryTypes.SELECT
				}
			)
		);
		const first = await time(() => listLicks(actor, { limit: 25 }));
		const deep = await time(() => listLicks(actor, { limit: 25, offset: 4000 }));
		const byTitle = await time(() => listLicks(actor, { q: 'porch', sort: 'title', limit: 25 }));
		const byTag = await time(() => listLicks(actor, { q: 'enclosure', limit: 25 }));
		const filtered = await time(() => listLicks(actor, { quality: 'm7', key: 'F', limit: 25 }));

		// A 200-tune file: the demo lines, numbered.
		const file = Array.from({ length: TUNES }, (_, i) =>
			DEMO_LICKS[i % DEMO_LICKS.length].abc
				.replace(/^X:1$/m, `X:${i + 1}`)
				.replace(/^T:(.*)$/m, `T:$1 ${i + 1}`)
		).join('\n\n');
		const parse = await time(async () => {
			for (const t of splitTunes(file)) prepareLick(t.text);
		}, 5);
		let n = 0;
		const importing = await time(async () => {
			n += 1;
			const someone = await User.create({
				email: `i${n}@example.test`,
				name: 'I',
				role: 'teacher',
				passwordHash: 'x'
			});
			const result = await importAbcFile({ id: someone.id, role: 'teacher' }, file);
			if (result.created.length !== TUNES) throw new Error(`import made ${result.created.length}`);
		}, 3);

		const ms = (t: { median: number }) => `${t.median.toFixed(2)} ms`;
		return [
			`Library of ${LICKS} licks (SQLite, one author), server time per page of 25 (median of 15):`,
			`  bare SELECT … ORDER BY updated_at LIMIT 25 (floor):   ${ms(floor)}`,
			`  listLicks, first page (with count and tags):          ${ms(first)}  (${(first.median / floor.median).toFixed(1)}× floor)`,
			`  listLicks, page 161 (offset 4000):                     ${ms(deep)}`,
			`  search a title word ("porch"), sorted by title:       ${ms(byTitle)}`,
			`  search a tag ("enclosure"):                            ${ms(byTag)}`,
			`  filter quality m7 + key F:                             ${ms(filtered)}`,
			`Import of a ${TUNES}-tune file (median of 3): ${importing.median.toFixed(0)} ms (${(importing.median / TUNES).toFixed(2)} ms a tune); the strict parse alone: ${parse.median.toFixed(0)} ms (${(importing.median / parse.median).toFixed(1)}×)`
		];
	} finally {
		await closeDb();
		await rm(dir, { recursive: true, force: true });
	}
}
