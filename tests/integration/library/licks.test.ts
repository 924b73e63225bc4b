import { existsSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as licksRoute from '../../../src/routes/api/licks/+server';
import * as lickRoute from '../../../src/routes/api/licks/[id]/+server';
import * as variantsRoute from '../../../src/routes/api/licks/[id]/variants/+server';
import * as recordingRoute from '../../../src/routes/api/licks/[id]/recording/+server';
import * as importRoute from '../../../src/routes/api/licks/import/+server';
import * as checkRoute from '../../../src/routes/api/licks/check/+server';
import * as decksRoute from '../../../src/routes/api/decks/+server';
import * as deckRoute from '../../../src/routes/api/decks/[id]/+server';
import { Lick } from '../../../src/lib/server/db/models/index';
import { exportDeck, exportLick } from '../../../src/lib/server/library/export';
import { importAbcFile } from '../../../src/lib/server/library/import';
import { copyLick, findSharedLick, getLick } from '../../../src/lib/server/library/licks';
import { call, lickAbc, openLibraryWorld, tinyWav, type LibraryWorld } from './world';

let w: LibraryWorld;
beforeAll(async () => {
	w = await openLibraryWorld();
});
afterAll(async () => {
	await w.close();
});

const upload = (text: string) => {
	const form = new FormData();
	form.set('file', new Blob([text], { type: 'text/plain' }), 'licks.abc');
	return form;
};

describe('saving a lick', () => {
	it('refuses invalid abc with the engine’s line, column and sentence, and stores nothing', async () => {
		const before = await Lick.count();
		const res = await call(licksRoute.POST, w.teacher, {
			body: { title: 'Broken', abc: 'X:1\nT:Broken\nK:C\n"C7" c d & e |' }
		});
		expect(res.status).toBe(422);
		expect(res.data.error).toMatchObject({ line: 4, column: 10 });
		expect(res.data.error.message).toMatch(/overlay/i);
		expect(await Lick.count()).toBe(before);
	});

	it('refuses an invalid hand-written version with its quality, and keeps the stored lick', async () => {
		const made = await call(licksRoute.POST, w.teacher, {
			body: { title: 'Kept', abc: lickAbc('Kept') }
		});
		const res = await call(lickRoute.PUT, w.teacher, {
			method: 'PUT',
			params: { id: made.data.id },
			body: { abc: lickAbc('Kept', '"C7" c2 d2 |]'), versions: { m7: 'X:1\nK:C\n"Cm7" c & d' } }
		});
		expect(res.status).toBe(422);
		expect(res.data.error).toMatchObject({ version: 'm7', line: 3 });
		const after = await call(lickRoute.GET, w.teacher, { params: { id: made.data.id } });
		expect(after.data.abc).toBe(made.data.abc);
		expect(after.data.versions).toEqual({});
	});

	it.each([
		[{ title: 'x' }, 422, 'abc'],
		[{ title: 'x', abc: 42 }, 400, 'abc'],
		[{ title: 'x', abc: lickAbc('x'), tempo: 1000 }, 422, 'tempo'],
		[{ title: 'x', abc: lickAbc('x'), visibility: 'friends' }, 422, 'visibility'],
		[{ title: 'x', abc: lickAbc('x'), colour: 'blue' }, 400, 'colour'],
		[{ title: 'x', abc: 'X:1\nK:C\nc d e f' }, 422, 'abc'],
		[{ title: 'x', abc: 'X:1\nK:C\n"C7"c d\n\nX:2\nK:C\n"C7"c' }, 422, 'abc']
	])('refuses %j with %i naming %s', async (body, status, field) => {
		const res = await call(licksRoute.POST, w.teacher, { body });
		expect(res.status).toBe(status);
		expect(res.data.error.field).toBe(field);
	});

	it('reads home key and quality from the abc, keeps title in T: and tempo in Q:', async () => {
		const res = await call(licksRoute.POST, w.teacher, {
			body: {
				title: 'Low road',
				abc: 'X:1\nT:old name\nM:4/4\nL:1/8\nK:Bb\n"Cm7" c _e g _b c\'2 z2 |]',
				tempo: 144,
				feel: 'straight',
				tags: [' Bebop ', 'Minor Line'],
				note: 'The **9** leads up.'
			}
		});
		expect(res.status).toBe(201);
		expect(res.data).toMatchObject({
			title: 'Low road',
			homeKey: 'Bb',
			homeQuality: 'm7',
			tempo: 144,
			feel: 1,
			visibility: 'private',
			tags: ['bebop', 'minor-line'],
			shareSlug: null
		});
		expect(res.data.abc).toContain('T:Low road\n');
		expect(res.data.abc).toContain('Q:1/4=144\n');
	});
});

describe('variants and the editor check', () => {
	it('gives all twelve keys for an instrument, or one key when asked', async () => {
		const made = await call(licksRoute.POST, w.teacher, {
			body: { title: 'Grid', abc: lickAbc('Grid') }
		});
		const all = await call(variantsRoute.GET, w.teacher, {
			params: { id: made.data.id },
			query: { instrument: 'alto-sax', quality: 'm7' }
		});
		expect(all.status).toBe(200);
		// Cycle of fourths from C (common practice).
		expect(all.data.variants.map((v: { key: string }) => v.key)).toEqual([
			'C',
			'F',
			'Bb',
			'Eb',
			'Ab',
			'Db',
			'Gb',
			'B',
			'E',
			'A',
			'D',
			'G'
		]);
		expect(all.data.variants[0]).toMatchObject({ instrument: 'alto-sax', quality: 'm7' });
		const one = await call(variantsRoute.GET, w.teacher, {
			params: { id: made.data.id },
			query: { key: 'Eb' }
		});
		expect(one.data.variants).toHaveLength(1);
		const bad = await call(variantsRoute.GET, w.teacher, {
			params: { id: made.data.id },
			query: { key: 'H' }
		});
		expect(bad.status).toBe(422);
	});

	it('checks unsaved abc: home, twelve variants and device tags, or the error’s place', async () => {
		const ok = await call(checkRoute.POST, w.learner, {
			body: { abc: lickAbc('x', '"C7" c d e g _b a g e | c4 z4 |]'), instrument: 'trumpet' }
		});
		expect(ok.status).toBe(200);
		expect(ok.data.home).toEqual({ key: 'C', quality: '7' });
		expect(ok.data.variants).toHaveLength(12);
		expect(ok.data.suggestedTags).toContain('arpeggio');
		const bad = await call(checkRoute.POST, w.learner, { body: { abc: 'X:1\nK:C\n"C7" c d & e' } });
		expect(bad.status).toBe(422);
		expect(bad.data.error).toMatchObject({ line: 3, column: 10 });
	});

	it('tells the editor where the two readings of abc 2.1 §11.3 differ, and which one it uses', async () => {
		const ok = await call(checkRoute.POST, w.learner, {
			body: { abc: lickAbc('x', '"C7" ^c c C2 z4 |]') }
		});
		expect(ok.status).toBe(200);
		const reading = ok.data.own.warnings.find(
			(x: { code: string }) => x.code === 'accidental-reading'
		);
		expect(reading.message).toContain('which is how it is read here');
		// read the standard's way: the C sounds C#4, MIDI 61 (REFERENCES.md §1; written Db over C7)
		expect(ok.data.own.notes[2].midi).toBe(61);
	});
});

describe('listing', () => {
	it('searches title and tag, filters, sorts and pages on the server', async () => {
		const mk = (title: string, body: string, tags: string[]) =>
			call(licksRoute.POST, w.stranger, { body: { title, abc: lickAbc(title, body), tags } });
		await mk('Alpha', '"C7" c d e g |]', ['enclosure']);
		await mk('Bravo', '"Cm7" c _e g _b |]', ['bebop']);
		await mk('Charlie', '"Cmaj7" c e g b |]', ['enclosure']);
		const list = (query: Record<string, string>) =>
			call(licksRoute.GET, w.stranger, { query }).then((r) => r.data);
		expect(
			(await list({ q: 'enclos', sort: 'title' })).items.map((i: { title: string }) => i.title)
		).toEqual(['Alpha', 'Charlie']);
		expect((await list({ q: 'BRAV' })).items.map((i: { title: string }) => i.title)).toEqual([
			'Bravo'
		]);
		expect((await list({ quality: 'maj7' })).items.map((i: { title: string }) => i.title)).toEqual([
			'Charlie'
		]);
		const page = await list({ sort: '-title', limit: '2', offset: '1' });
		expect(page.total).toBe(3);
		expect(page.items.map((i: { title: string }) => i.title)).toEqual(['Bravo', 'Alpha']);
	});
});

describe('import and export', () => {
	it('imports the valid tunes of a file and reports the broken one with its tune and file line', async () => {
		const file = [
			lickAbc('One'),
			'',
			'X:2\nT:Two\nK:C\n"C7" c d & e |',
			'',
			lickAbc('Three').replace('X:1', 'X:3')
		].join('\n');
		const res = await call(importRoute.POST, w.learner, { raw: upload(file) });
		expect(res.status).toBe(200);
		expect(res.data.created.map((c: { title: string }) => c.title)).toEqual(['One', 'Three']);
		expect(res.data.failed).toEqual([
			{ tune: 2, title: 'Two', line: 12, column: 10, message: expect.stringMatching(/overlay/i) }
		]);
	});

	it('refuses a file with no tune (422), too many tunes (422) and an empty form (400)', async () => {
		expect((await call(importRoute.POST, w.learner, { raw: upload('just words') })).status).toBe(
			422
		);
		const many = Array.from({ length: 201 }, (_, i) =>
			lickAbc(`T${i}`).replace('X:1', `X:${i + 1}`)
		).join('\n\n');
		expect((await call(importRoute.POST, w.learner, { raw: upload(many) })).status).toBe(422);
		expect((await call(importRoute.POST, w.learner, { raw: new FormData() })).status).toBe(400);
	});

	it('exports a lick and a deck to files that import back to the same licks', async () => {
		const a = await call(licksRoute.POST, w.teacher, {
			body: {
				title: 'Round trip',
				abc: lickAbc('Round trip'),
				tags: ['arpeggio', 'blues'],
				feel: 1.5,
				tempo: 176,
				note: 'First line.\n\n- a *point*\n- another',
				versions: { m7: 'X:1\nT:Round trip m7\nM:4/4\nL:1/8\nK:C\n"Cm7" c d _e g _b a g _e |]' }
			}
		});
		const b = await call(licksRoute.POST, w.teacher, {
			body: { title: 'Second', abc: lickAbc('Second') }
		});
		const deck = await call(decksRoute.POST, w.teacher, {
			body: { name: 'Trip', lickIds: [b.data.id, a.data.id] }
		});
		const comparable = (l: Awaited<ReturnType<typeof getLick>>) => ({
			title: l.title,
			abc: l.abc,
			tags: l.tags,
			feel: l.feel,
			tempo: l.tempo,
			note: l.note,
			versions: l.versions,
			homeKey: l.homeKey,
			homeQuality: l.homeQuality
		});
		const single = await exportLick(w.teacher, a.data.id);
		expect(single.name).toBe('round-trip.abc');
		const again = await importAbcFile(w.learner, single.text);
		expect(again.failed).toEqual([]);
		expect(comparable(await getLick(w.learner, again.created[0].id))).toEqual(
			comparable(await getLick(w.teacher, a.data.id))
		);
		const whole = await exportDeck(w.teacher, deck.data.id);
		const back = await importAbcFile(w.learner, whole.text);
		expect(back.created.map((c) => c.title)).toEqual(['Second', 'Round trip']);
		expect(back.created[1].versions).toEqual(['m7']);
	});
});

describe('decks', () => {
	it('keeps the order given, reorders, renames, and deleting it keeps the licks', async () => {
		const ids: string[] = [];
		for (const t of ['D1', 'D2', 'D3']) {
			ids.push(
				(await call(licksRoute.POST, w.learner, { body: { title: t, abc: lickAbc(t) } })).data.id
			);
		}
		const deck = await call(decksRoute.POST, w.learner, { body: { name: 'Order', lickIds: ids } });
		const titles = (d: { licks: { title: string }[] }) => d.licks.map((l) => l.title);
		expect(titles(deck.data)).toEqual(['D1', 'D2', 'D3']);
		const moved = await call(deckRoute.PUT, w.learner, {
			method: 'PUT',
			params: { id: deck.data.id },
			body: { name: 'Order, new', lickIds: [ids[2], ids[0], ids[1]] }
		});
		expect(moved.data).toMatchObject({ name: 'Order, new', lickCount: 3 });
		expect(titles(moved.data)).toEqual(['D3', 'D1', 'D2']);
		expect(
			(
				await call(deckRoute.PUT, w.learner, {
					method: 'PUT',
					params: { id: deck.data.id },
					body: { lickIds: [ids[0], ids[0]] }
				})
			).status
		).toBe(422);
		expect(
			(await call(deckRoute.DELETE, w.learner, { method: 'DELETE', params: { id: deck.data.id } }))
				.status
		).toBe(204);
		expect((await call(lickRoute.GET, w.learner, { params: { id: ids[0] } })).status).toBe(200);
	});
});

describe('sharing, copying and deleting', () => {
	it('gives a public lick a share slug that finds it, and copies it into another library', async () => {
		const made = await call(licksRoute.POST, w.teacher, {
			body: { title: 'Shared', abc: lickAbc('Shared'), visibility: 'public' }
		});
		const slug = made.data.shareSlug as string;
		expect(slug).toMatch(/^[A-Za-z0-9_-]{12}$/);
		expect((await findSharedLick(slug))?.title).toBe('Shared');
		const copy = await copyLick(w.stranger, made.data.id);
		expect(copy).toMatchObject({
			title: 'Shared',
			visibility: 'private',
			copiedFromId: made.data.id,
			mine: true
		});
		await call(lickRoute.PUT, w.teacher, {
			method: 'PUT',
			params: { id: made.data.id },
			body: { visibility: 'private' }
		});
		expect(await findSharedLick(slug)).toBeNull();
	});

	it('deletes a lick’s recording file with the lick', async () => {
		const made = await call(licksRoute.POST, w.teacher, {
			body: { title: 'Heard', abc: lickAbc('Heard') }
		});
		await call(recordingRoute.PUT, w.teacher, {
			method: 'PUT',
			params: { id: made.data.id },
			raw: tinyWav()
		});
		const key = (await Lick.findByPk(made.data.id))!.recordingKey!;
		const file = path.join(w.dataDir, 'uploads', key);
		expect(existsSync(file)).toBe(true);
		expect(
			(await call(lickRoute.DELETE, w.teacher, { method: 'DELETE', params: { id: made.data.id } }))
				.status
		).toBe(204);
		expect(existsSync(file)).toBe(false);
	});
});
