import { beforeEach, describe, expect, it } from 'vitest';
import { POST } from '../../../../src/routes/api/transpose/grid/+server';
import { configureTransposeLimit } from '../../../../src/lib/server/music/transpose-request';
import { configureEngineBudget } from '../../../../src/lib/server/music/render';
import { DEMO_LICKS } from '../../../../src/lib/demo/licks';

type Event = Parameters<typeof POST>[0];
const call = async (body: unknown, address = '203.0.113.20') => {
	const request = new Request('http://localhost/api/transpose/grid', {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});
	const event = { request, getClientAddress: () => address } as unknown as Event;
	const response = await POST(event);
	return { status: response.status, body: await response.json(), headers: response.headers };
};

const LICK = DEMO_LICKS[0].abc; // Blue turn, over C7 in C, Q:1/4=132

describe('POST /api/transpose/grid', () => {
	beforeEach(() => {
		configureTransposeLimit({ max: 1000, windowMs: 60_000 });
		configureEngineBudget();
	});

	it('answers every key round the cycle of fourths in the lick’s own quality by default', async () => {
		const r = await call({ abc: LICK });
		expect(r.status).toBe(200);
		// The usual twelve-key order (common practice; REFERENCES.md §2).
		const cycle = ['C', 'F', 'Bb', 'Eb', 'Ab', 'Db', 'Gb', 'B', 'E', 'A', 'D', 'G'];
		expect(r.body.keys).toEqual(cycle);
		expect(r.body.qualities).toEqual(['7']);
		expect(r.body.variants.map((v: { key: string }) => v.key)).toEqual(cycle);
		// Each variant has the shape of a /api/transpose answer, with meter and tempo.
		expect(r.body.variants[2]).toMatchObject({
			key: 'Bb',
			concertKey: 'Bb',
			writtenTonic: 'Bb',
			quality: '7',
			instrument: 'concert',
			meter: '4/4',
			beatsPerBar: 4,
			tempo: 132,
			handWritten: false
		});
		expect(r.body.variants[2].notes[0]).toHaveProperty('writtenPitch');
	});

	it('spells the default keys for a minor lick as jazz spells minor keys (C#m, not Dbm)', async () => {
		const r = await call({ abc: 'X:1\nL:1/8\nK:Am\n"Am7"A c e g|]' });
		expect(r.body.keys).toEqual(['C', 'F', 'Bb', 'Eb', 'G#', 'C#', 'F#', 'B', 'E', 'A', 'D', 'G']);
		expect(r.body.variants.every((v: { warnings: unknown[] }) => v.warnings.length === 0)).toBe(
			true
		);
	});

	it('renders keys × qualities, keys outer, written for the instrument asked', async () => {
		const r = await call({
			abc: LICK,
			keys: ['C', 'Eb'],
			qualities: ['7', 'm7', '7sus4'],
			instrument: 'alto-sax'
		});
		expect(r.status).toBe(200);
		expect(r.body.variants.map((v: { key: string; quality: string }) => v.key + v.quality)).toEqual(
			['C7', 'Cm7', 'C7sus4', 'Eb7', 'Ebm7', 'Eb7sus4']
		);
		// Alto saxophone reads a major sixth above concert (REFERENCES.md §4): concert Eb is written C.
		expect(r.body.variants[3]).toMatchObject({ concertKey: 'Eb', writtenTonic: 'C' });
	});

	it('counts one grid as one request against the per-address limit', async () => {
		configureTransposeLimit({ max: 2, windowMs: 60_000 });
		expect((await call({ abc: LICK }, '198.51.100.1')).status).toBe(200);
		expect((await call({ abc: LICK }, '198.51.100.1')).status).toBe(200);
		const third = await call({ abc: LICK }, '198.51.100.1');
		expect(third.status).toBe(429);
		expect(third.headers.get('retry-after')).toBeTruthy();
	});

	it.each([
		[{ abc: LICK, keys: 'C' }, 400, 'keys'],
		[{ abc: LICK, keys: [] }, 422, 'keys'],
		[{ abc: LICK, keys: ['H'] }, 422, '“H”'],
		[{ abc: LICK, qualities: ['m9'] }, 422, '“m9”'],
		[{ abc: LICK, qualities: '7' }, 400, 'qualities'],
		[{ abc: LICK, instrument: 'kazoo' }, 422, 'kazoo'],
		[{ abc: LICK, colour: 'blue' }, 400, 'colour'],
		[{ abc: 'X:1\nK:C\n"C7 C|' }, 422, '']
	])('refuses %j with %d and a sentence', async (body, status, word) => {
		const r = await call(body);
		expect(r.status).toBe(status);
		expect(r.body.error.message).toContain(word);
	});

	it('refuses, with a sentence, a text whose answer would pass 1 MB', async () => {
		// 20 KB of notes: a legal abc text, but not a lick (every note is sent with every variant).
		const long = 'X:1\nL:1/8\nK:C\n"C7"' + 'CDEF GABc |'.repeat(1700) + ']';
		const r = await call({ abc: long });
		expect(r.status).toBe(413);
		expect(r.body.error.message).toMatch(/KB.*fewer keys/);
	});

	it('answers 503 with Retry-After once the global engine budget of the second is spent', async () => {
		configureEngineBudget(0.000001);
		expect((await call({ abc: LICK }, '198.51.100.2')).status).toBe(200);
		const busy = await call({ abc: LICK }, '198.51.100.3');
		expect(busy.status).toBe(503);
		expect(busy.headers.get('retry-after')).toBe('1');
		expect(busy.body.error.message).toContain('busy');
	});
});
