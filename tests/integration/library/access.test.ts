import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as licksRoute from '../../../src/routes/api/licks/+server';
import * as lickRoute from '../../../src/routes/api/licks/[id]/+server';
import * as variantsRoute from '../../../src/routes/api/licks/[id]/variants/+server';
import * as exportRoute from '../../../src/routes/api/licks/[id]/export/+server';
import * as recordingRoute from '../../../src/routes/api/licks/[id]/recording/+server';
import * as importRoute from '../../../src/routes/api/licks/import/+server';
import * as checkRoute from '../../../src/routes/api/licks/check/+server';
import * as decksRoute from '../../../src/routes/api/decks/+server';
import * as deckRoute from '../../../src/routes/api/decks/[id]/+server';
import * as deckExportRoute from '../../../src/routes/api/decks/[id]/export/+server';
import type { SessionUser } from '../../../src/lib/server/auth/session';
import { call, lickAbc, openLibraryWorld, tinyWav, type LibraryWorld } from './world';

/**
 * Who may do what, route by route. Each row names an actor and the status the route must give;
 * removing an access check from a service turns a 404 or 403 here into a 200.
 */
let w: LibraryWorld;
/** The teacher's licks by visibility, a learner's own lick, and the teacher's deck. */
const ids = { private: '', classes: '', public: '', learnerOwn: '', deck: '', assignedDeck: '' };

beforeAll(async () => {
	w = await openLibraryWorld();
	for (const visibility of ['private', 'classes', 'public'] as const) {
		const made = await call(licksRoute.POST, w.teacher, {
			body: { title: `Teacher ${visibility}`, abc: lickAbc(`Teacher ${visibility}`), visibility }
		});
		expect(made.status).toBe(201);
		ids[visibility] = made.data.id;
	}
	const own = await call(licksRoute.POST, w.learner, {
		body: { title: 'Mine', abc: lickAbc('Mine') }
	});
	ids.learnerOwn = own.data.id;
	const deck = await call(decksRoute.POST, w.teacher, {
		body: { name: 'Private deck', lickIds: [ids.private, ids.public] }
	});
	expect(deck.status).toBe(201);
	ids.deck = deck.data.id;
	const assigned = await call(decksRoute.POST, w.teacher, {
		body: { name: 'Assigned deck', lickIds: [ids.private] }
	});
	ids.assignedDeck = assigned.data.id;
	await w.assign(ids.assignedDeck);
});

afterAll(async () => {
	await w.close();
});

type Who = 'teacher' | 'learner' | 'stranger' | 'nobody';
const as = (who: Who): SessionUser | null => (who === 'nobody' ? null : w[who]);

describe('reading a lick', () => {
	// private: only the author, and class members once a deck holding it is assigned to them.
	const cases: [keyof typeof ids, Who, number][] = [
		['private', 'teacher', 200],
		['private', 'learner', 200],
		['private', 'stranger', 404],
		['private', 'nobody', 401],
		['classes', 'learner', 200],
		['classes', 'stranger', 404],
		['public', 'stranger', 200],
		['learnerOwn', 'teacher', 404]
	];
	it.each(cases)('GET /api/licks/%s as %s answers %i', async (lick, who, status) => {
		const res = await call(lickRoute.GET, as(who), { params: { id: ids[lick] } });
		expect(res.status).toBe(status);
	});

	it.each(cases)('GET /api/licks/%s/variants as %s answers %i', async (lick, who, status) => {
		const res = await call(variantsRoute.GET, as(who), {
			params: { id: ids[lick] },
			query: { key: 'Eb' }
		});
		expect(res.status).toBe(status);
	});

	it.each(cases)('GET /api/licks/%s/export as %s answers %i', async (lick, who, status) => {
		const res = await call(exportRoute.GET, as(who), { params: { id: ids[lick] } });
		expect(res.status).toBe(status);
	});

	it('a private lick not in an assigned deck is hidden from the class', async () => {
		const made = await call(licksRoute.POST, w.teacher, {
			body: { title: 'Hidden', abc: lickAbc('Hidden') }
		});
		expect((await call(lickRoute.GET, w.learner, { params: { id: made.data.id } })).status).toBe(
			404
		);
	});

	it('a lick shared with classes is hidden from a member of another teacher’s class', async () => {
		const made = await call(licksRoute.POST, w.stranger, {
			body: { title: 'Other studio', abc: lickAbc('Other studio'), visibility: 'classes' }
		});
		expect((await call(lickRoute.GET, w.learner, { params: { id: made.data.id } })).status).toBe(
			404
		);
	});

	it('a malformed id is not found rather than a server error', async () => {
		expect((await call(lickRoute.GET, w.teacher, { params: { id: 'nope' } })).status).toBe(404);
	});
});

describe('listing licks', () => {
	const titles = (data: { items: { title: string }[] }) => data.items.map((i) => i.title).sort();

	it('lists only the actor’s own licks by default', async () => {
		const res = await call(licksRoute.GET, w.learner);
		expect(res.status).toBe(200);
		expect(titles(res.data)).toEqual(['Mine']);
	});

	it('lists everything the actor may read with scope=all, and nothing private of others', async () => {
		const learner = await call(licksRoute.GET, w.learner, {
			query: { scope: 'all', q: 'teacher' }
		});
		expect(titles(learner.data)).toEqual(['Teacher classes', 'Teacher private', 'Teacher public']);
		const stranger = await call(licksRoute.GET, w.stranger, {
			query: { scope: 'all', q: 'teacher' }
		});
		expect(titles(stranger.data)).toEqual(['Teacher public']);
		expect(stranger.data.total).toBe(1);
	});

	it('answers 401 signed out and 400 for a bad limit', async () => {
		expect((await call(licksRoute.GET, null)).status).toBe(401);
		expect((await call(licksRoute.GET, w.teacher, { query: { limit: '0' } })).status).toBe(400);
		expect((await call(licksRoute.GET, w.teacher, { query: { sort: 'colour' } })).status).toBe(400);
	});
});

describe('changing a lick', () => {
	const cases: [keyof typeof ids, Who, number][] = [
		['private', 'learner', 403],
		['private', 'stranger', 404],
		['classes', 'learner', 403],
		['public', 'stranger', 403],
		['public', 'nobody', 401]
	];
	it.each(cases)(
		'PUT /api/licks/%s as %s answers %i and changes nothing',
		async (lick, who, status) => {
			const res = await call(lickRoute.PUT, as(who), {
				method: 'PUT',
				params: { id: ids[lick] },
				body: { title: 'Taken over' }
			});
			expect(res.status).toBe(status);
			const after = await call(lickRoute.GET, w.teacher, { params: { id: ids[lick] } });
			expect(after.data.title).not.toBe('Taken over');
		}
	);

	it.each(cases)(
		'DELETE /api/licks/%s as %s answers %i and keeps the lick',
		async (lick, who, status) => {
			const res = await call(lickRoute.DELETE, as(who), {
				method: 'DELETE',
				params: { id: ids[lick] }
			});
			expect(res.status).toBe(status);
			expect((await call(lickRoute.GET, w.teacher, { params: { id: ids[lick] } })).status).toBe(
				200
			);
		}
	);

	it('lets the author change their own lick', async () => {
		const res = await call(lickRoute.PUT, w.learner, {
			method: 'PUT',
			params: { id: ids.learnerOwn },
			body: { tempo: 150 }
		});
		expect(res.status).toBe(200);
		expect(res.data.tempo).toBe(150);
	});
});

describe('recordings', () => {
	it('lets only the author upload, and only readers hear it, in byte ranges', async () => {
		const wav = tinyWav(100);
		const refused: [keyof typeof ids, Who, number][] = [
			['classes', 'learner', 403],
			['private', 'stranger', 404],
			['classes', 'nobody', 401]
		];
		for (const [lick, who, status] of refused) {
			const res = await call(recordingRoute.PUT, as(who), {
				method: 'PUT',
				params: { id: ids[lick] },
				raw: wav
			});
			expect(res.status, `${who} on ${lick}`).toBe(status);
		}
		const put = await call(recordingRoute.PUT, w.teacher, {
			method: 'PUT',
			params: { id: ids.classes },
			raw: wav
		});
		expect(put.status).toBe(200);
		expect(put.data).toEqual({ type: 'audio/wav', size: 144 });

		const ranged = await call(recordingRoute.GET, w.learner, {
			params: { id: ids.classes },
			headers: { range: 'bytes=0-3' }
		});
		expect(ranged.status).toBe(206);
		expect(ranged.headers.get('content-range')).toBe('bytes 0-3/144');
		expect(ranged.data).toBe('RIFF');
		const outside = await call(recordingRoute.GET, w.learner, {
			params: { id: ids.classes },
			headers: { range: 'bytes=500-' }
		});
		expect(outside.status).toBe(416);
		expect(
			(await call(recordingRoute.GET, w.stranger, { params: { id: ids.classes } })).status
		).toBe(404);

		const del = await call(recordingRoute.DELETE, w.learner, {
			method: 'DELETE',
			params: { id: ids.classes }
		});
		expect(del.status).toBe(403);
		expect(
			(await call(recordingRoute.GET, w.learner, { params: { id: ids.classes } })).status
		).toBe(200);
	});

	it('refuses bytes that are not audio with 415, whatever their name', async () => {
		const res = await call(recordingRoute.PUT, w.teacher, {
			method: 'PUT',
			params: { id: ids.public },
			raw: new TextEncoder().encode('ID3 but really a text file pretending to be an mp3')
		});
		expect(res.status).toBe(415);
	});
});

describe('import and check', () => {
	it('answers 401 signed out', async () => {
		const form = new FormData();
		form.set('file', new Blob([lickAbc('x')]), 'x.abc');
		expect((await call(importRoute.POST, null, { raw: form })).status).toBe(401);
		expect((await call(checkRoute.POST, null, { body: { abc: lickAbc('x') } })).status).toBe(401);
	});
});

describe('decks', () => {
	it.each([
		['teacher', 200],
		['learner', 404],
		['stranger', 404],
		['nobody', 401]
	] as [Who, number][])(
		'GET /api/decks/:id of an unassigned deck as %s answers %i',
		async (who, status) => {
			expect((await call(deckRoute.GET, as(who), { params: { id: ids.deck } })).status).toBe(
				status
			);
			expect((await call(deckExportRoute.GET, as(who), { params: { id: ids.deck } })).status).toBe(
				status
			);
		}
	);

	it('lets a class member read an assigned deck but not change or delete it', async () => {
		const read = await call(deckRoute.GET, w.learner, { params: { id: ids.assignedDeck } });
		expect(read.status).toBe(200);
		expect(read.data.licks.map((l: { title: string }) => l.title)).toEqual(['Teacher private']);
		const put = await call(deckRoute.PUT, w.learner, {
			method: 'PUT',
			params: { id: ids.assignedDeck },
			body: { name: 'Mine now' }
		});
		expect(put.status).toBe(403);
		expect(
			(
				await call(deckRoute.DELETE, w.learner, {
					method: 'DELETE',
					params: { id: ids.assignedDeck }
				})
			).status
		).toBe(403);
	});

	it('lets a stranger neither rename nor delete a deck they cannot see', async () => {
		const put = await call(deckRoute.PUT, w.stranger, {
			method: 'PUT',
			params: { id: ids.deck },
			body: { name: 'x' }
		});
		expect(put.status).toBe(404);
		expect(
			(await call(deckRoute.DELETE, w.stranger, { method: 'DELETE', params: { id: ids.deck } }))
				.status
		).toBe(404);
		expect((await call(deckRoute.GET, w.teacher, { params: { id: ids.deck } })).data.name).toBe(
			'Private deck'
		);
	});

	it('refuses another author’s private lick in a deck, and accepts a public one', async () => {
		const refused = await call(decksRoute.POST, w.stranger, {
			body: { name: 'Grab', lickIds: [ids.private] }
		});
		expect(refused.status).toBe(422);
		expect((await call(decksRoute.GET, w.stranger)).data.total).toBe(0);
		const fine = await call(decksRoute.POST, w.stranger, {
			body: { name: 'Found', lickIds: [ids.public] }
		});
		expect(fine.status).toBe(201);
	});

	it('lists only the decks the actor may read', async () => {
		const learner = await call(decksRoute.GET, w.learner);
		expect(learner.data.items.map((d: { name: string }) => d.name)).toEqual(['Assigned deck']);
		expect((await call(decksRoute.GET, null)).status).toBe(401);
	});

	it('refuses to delete a deck a class has assigned (409) and keeps it', async () => {
		const res = await call(deckRoute.DELETE, w.teacher, {
			method: 'DELETE',
			params: { id: ids.assignedDeck }
		});
		expect(res.status).toBe(409);
	});
});
