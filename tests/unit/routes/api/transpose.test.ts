import { beforeEach, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { POST } from '../../../../src/routes/api/transpose/+server';
import { configureTransposeLimit } from '../../../../src/lib/server/music/transpose-request';
import { configureEngineBudget } from '../../../../src/lib/server/music/render';

type Event = Parameters<typeof POST>[0];
const call = async (
	body: unknown,
	options: { raw?: string; type?: string; address?: string } = {}
) => {
	const text = options.raw ?? JSON.stringify(body);
	const request = new Request('http://localhost/api/transpose', {
		method: 'POST',
		headers: { 'content-type': options.type ?? 'application/json' },
		body: text
	});
	const event = {
		request,
		getClientAddress: () => options.address ?? '203.0.113.9'
	} as unknown as Event;
	const response = await POST(event);
	return { status: response.status, body: await response.json(), headers: response.headers };
};

const LICK = 'X:1\nT:Lick\nM:4/4\nL:1/8\nK:Bb\n"Bb7"B,DFA _A=GFD|\n';

describe('POST /api/transpose', () => {
	beforeEach(() => {
		configureTransposeLimit({ max: 1000, windowMs: 60_000 });
		// The global engine budget has its own test (transpose-grid.test.ts): out of the way here.
		configureEngineBudget(1e9);
	});

	it('answers 200 with the variant, its key, quality, instrument, warnings and notes', async () => {
		const r = await call({ abc: LICK, to: 'C' });
		expect(r.status).toBe(200);
		expect(r.body).toMatchObject({ key: 'C', quality: '7', instrument: 'concert', warnings: [] });
		expect(r.body.abc).toContain('"C7"');
		expect(r.body.notes[0]).toMatchObject({
			pitch: 'C4',
			midi: 60,
			degree: 'R',
			chord: { symbol: 'C7' }
		});
	});

	it('uses a hand-written version for its quality and says so', async () => {
		const minor = 'X:1\nM:4/4\nL:1/8\nK:Bb\n"Bbm7"B,_DFA _A=GFD|\n';
		const r = await call({ abc: LICK, quality: 'm7', versions: { m7: minor } });
		expect(r.status).toBe(200);
		expect(r.body).toMatchObject({ quality: 'm7', handWritten: true, key: 'Bb' });
		const plain = await call({ abc: LICK, quality: 'm7' });
		expect(plain.body.handWritten).toBe(false);
	});

	it('refuses malformed versions with 400 or 422 and a message', async () => {
		expect((await call({ abc: LICK, versions: ['X:1'] })).status).toBe(400);
		expect((await call({ abc: LICK, versions: { m7: 3 } })).status).toBe(400);
		const unknown = await call({ abc: LICK, versions: { m9: 'X:1\nK:C\nC' } });
		expect(unknown.status).toBe(422);
		expect(unknown.body.error.message).toContain('m9');
		const broken = await call({ abc: LICK, quality: 'm7', versions: { m7: 'X:1\nK:C\n"Cm7 C|' } });
		expect(broken.status).toBe(422);
		expect(broken.body.error).toMatchObject({ line: 3 });
	});

	it('re-maps and writes for an instrument', async () => {
		const r = await call({ abc: LICK, to: 'Eb', quality: 'm7', instrument: 'alto-sax' });
		expect(r.status).toBe(200);
		expect(r.body).toMatchObject({
			key: 'Eb',
			quality: 'm7',
			instrument: 'alto-sax',
			writtenKey: 'C'
		});
	});

	it('answers malformed abc with 422 and a positioned error', async () => {
		const r = await call({ abc: 'X:1\nK:C\n"C7 CDE' });
		expect(r.status).toBe(422);
		expect(r.body.error).toMatchObject({ line: 3, column: 1 });
		expect(r.body.error.message).toMatch(/double quote/);
	});

	it.each([
		[{ abc: LICK, to: 'H' }, 422, /not a key/],
		[{ abc: LICK, quality: 'maj13' }, 422, /not a chord quality/],
		[{ abc: LICK, instrument: 'kazoo' }, 422, /not an instrument/],
		[{ abc: LICK, tritone: 'Fb' }, 422, /tritone/],
		[{ abc: LICK, colour: 'red' }, 400, /Unknown field/],
		[{ abc: 42 }, 400, /abc notation as text/],
		// Empty: said to a musician, with an example of what to write.
		[{ abc: '' }, 400, /^There is no lick to play yet\. Write it in abc notation: .*“K:C”/],
		[{ abc: '  \n ' }, 400, /^There is no lick to play yet/],
		[{ abc: LICK, to: 5 }, 400, /must be a string/],
		[[LICK], 400, /JSON object/],
		[null, 400, /JSON object/]
	])('answers %j with %i and a message', async (body, status, message) => {
		const r = await call(body);
		expect(r.status).toBe(status);
		expect(r.body.error.message).toMatch(message);
	});

	it('answers unreadable JSON with 400, a non-JSON body with 415 and a body over 20 KB with 413', async () => {
		expect((await call(null, { raw: '{"abc":' })).status).toBe(400);
		expect((await call({ abc: LICK }, { type: 'text/plain' })).status).toBe(415);
		const big = await call({ abc: LICK + 'C'.repeat(21 * 1024) });
		expect(big.status).toBe(413);
		expect(big.body.error.message).toMatch(/20 KB/);
	});

	it('limits each client address and says when to come back', async () => {
		configureTransposeLimit({ max: 2, windowMs: 60_000 });
		expect((await call({ abc: LICK })).status).toBe(200);
		expect((await call({ abc: LICK })).status).toBe(200);
		const third = await call({ abc: LICK });
		expect(third.status).toBe(429);
		// Whole seconds until the one-minute window lets a hit through again.
		const wait = Number(third.headers.get('retry-after'));
		expect(wait).toBeGreaterThanOrEqual(1);
		expect(wait).toBeLessThanOrEqual(60);
		expect((await call({ abc: LICK }, { address: '198.51.100.1' })).status).toBe(200);
	});

	it('never answers 500 to garbage bodies (seeded)', async () => {
		await fc.assert(
			fc.asyncProperty(
				fc.oneof(
					fc.string({ maxLength: 200 }),
					fc.json(),
					fc.record({
						abc: fc.string({ maxLength: 200 }),
						to: fc.option(fc.string({ maxLength: 4 }))
					})
				),
				async (garbage) => {
					const raw = typeof garbage === 'string' ? garbage : JSON.stringify(garbage);
					const r = await call(null, { raw });
					expect([200, 400, 413, 422]).toContain(r.status);
					if (r.status !== 200) expect(typeof r.body.error.message).toBe('string');
				}
			),
			{ numRuns: 300, seed: 3 }
		);
	});
});
