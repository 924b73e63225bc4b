import { describe, expect, it } from 'vitest';
import { Note } from 'tonal';
import {
	allowedKeys,
	FOURTHS_ORDER,
	keyPitchClass,
	pickKey,
	TWELVE_KEYS,
	type KeyPlay
} from '../../../src/lib/practice/keys';

const NOW = new Date('2026-03-10T18:00:00Z');
const DAY = 86_400_000;
const play = (key: string, daysAgo: number, grade = 3): KeyPlay => ({
	key,
	at: new Date(NOW.getTime() - daysAgo * DAY),
	grade
});

describe('key tables', () => {
	it('spells the twelve keys with distinct pitch classes, as tonal 6.5.1 Note.chroma does', () => {
		// tonal 6.5.1 `Note.chroma` (run) as the outside check of our pitch classes.
		for (const k of TWELVE_KEYS) expect(keyPitchClass(k)).toBe(Note.chroma(k));
		for (const k of ['F#', 'C#', 'Cb', 'E#']) expect(keyPitchClass(k)).toBe(Note.chroma(k));
		expect(new Set(TWELVE_KEYS.map(keyPitchClass)).size).toBe(12);
	});

	it('orders the cycle of fourths C F Bb Eb Ab Db Gb B E A D G, each a fourth up (common practice; tonal Note.transpose)', () => {
		expect(FOURTHS_ORDER.join(' ')).toBe('C F Bb Eb Ab Db Gb B E A D G');
		for (let i = 0; i < 12; i++) {
			const up = Note.transpose(FOURTHS_ORDER[i], '4P');
			expect(Note.chroma(up)).toBe(keyPitchClass(FOURTHS_ORDER[(i + 1) % 12]));
		}
	});

	it.each([
		[null, TWELVE_KEYS.length],
		[[], 12],
		[['F', 'Bb', 'F', 'A#', 'H'], 2]
	] as const)('allowed keys %j give %i keys, no pitch class twice', (input, n) => {
		expect(allowedKeys(input)).toHaveLength(n);
	});

	it('reads garbage as no key', () => {
		for (const k of ['', 'H', 'Cbb', 'c', 'Eb7']) expect(keyPitchClass(k)).toBeNull();
	});
});

describe('pickKey', () => {
	it('goes round the cycle of fourths from the last key played', () => {
		expect(pickKey({ mode: 'fourths', history: [play('C', 1)], seed: 's', now: NOW })).toBe('F');
		expect(pickKey({ mode: 'fourths', history: [play('G', 1)], seed: 's', now: NOW })).toBe('C');
		expect(pickKey({ mode: 'fourths', history: [], seed: 's', now: NOW })).toBe('C');
		// Within an assignment's keys: after Bb the next allowed one round the cycle.
		expect(
			pickKey({
				mode: 'fourths',
				allowed: ['C', 'Bb', 'D'],
				history: [play('Bb', 1)],
				seed: 's',
				now: NOW
			})
		).toBe('D');
	});

	it('keeps a fixed key', () => {
		const history = [play('Eb', 1), play('Eb', 0)];
		expect(pickKey({ mode: 'fixed', fixedKey: 'Eb', history, seed: 's', now: NOW })).toBe('Eb');
		expect(pickKey({ mode: 'fixed', allowed: ['G'], history, seed: 's', now: NOW })).toBe('G');
	});

	it('prefers a key never played for the lick', () => {
		const history = TWELVE_KEYS.filter((k) => k !== 'E').map((k, i) => play(k, 12 - i));
		for (const seed of ['a', 'b', 'c', 'd']) {
			expect(pickKey({ mode: 'weighted', history, seed, now: NOW })).toBe('E');
		}
	});

	it('leans toward keys graded worst and played longest ago', () => {
		const history: KeyPlay[] = [
			play('Ab', 30, 1),
			play('Ab', 29, 1),
			...TWELVE_KEYS.filter((k) => k !== 'Ab' && k !== 'C').map((k) => play(k, 1, 4)),
			play('C', 0, 4)
		];
		const counts = new Map<string, number>();
		for (let i = 0; i < 400; i++) {
			const k = pickKey({ mode: 'weighted', history, seed: `s${i}`, now: NOW });
			counts.set(k, (counts.get(k) ?? 0) + 1);
		}
		const ab = counts.get('Ab') ?? 0;
		for (const [k, n] of counts) if (k !== 'Ab') expect(ab, k).toBeGreaterThan(2 * n);
		expect(counts.has('C')).toBe(false);
	});

	it('never picks the key just played while another is allowed', () => {
		for (let i = 0; i < 200; i++) {
			const history = [play('D', 2), play('F', 0)];
			expect(
				pickKey({ mode: 'weighted', allowed: ['F', 'D'], history, seed: `x${i}`, now: NOW })
			).toBe('D');
			expect(pickKey({ mode: 'weighted', history, seed: `y${i}`, now: NOW })).not.toBe('F');
		}
		expect(
			pickKey({ mode: 'weighted', allowed: ['F'], history: [play('F', 0)], seed: 's', now: NOW })
		).toBe('F');
	});

	it('repeats for the same seed', () => {
		const input = { mode: 'weighted' as const, history: [play('C', 3), play('G', 1)], now: NOW };
		expect(pickKey({ ...input, seed: 'same' })).toBe(pickKey({ ...input, seed: 'same' }));
	});
});

describe('a simulated month of daily sittings over an all-keys deck', () => {
	it.each(['weighted', 'fourths'] as const)(
		'%s: every key of every lick is prompted, never the same key twice running for one lick',
		(mode) => {
			// Eight licks, four a sitting (each lick every other day), 30 daily sittings.
			const licks = Array.from({ length: 8 }, (_, i) => `lick-${i}`);
			const history = new Map<string, KeyPlay[]>(licks.map((l) => [l, []]));
			let twiceRunning = 0;
			for (let day = 0; day < 30; day++) {
				const now = new Date(NOW.getTime() + day * DAY);
				for (let j = 0; j < 4; j++) {
					const lick = licks[(day * 4 + j) % licks.length];
					const past = history.get(lick)!;
					const key = pickKey({ mode, history: past, seed: `${lick}:${past.length}`, now });
					if (past.at(-1)?.key === key) twiceRunning++;
					past.push({ key, at: now, grade: ((day + j) % 4) + 1 });
				}
			}
			expect(twiceRunning).toBe(0);
			for (const lick of licks) {
				const keys = new Set(history.get(lick)!.map((p) => keyPitchClass(p.key)));
				expect(keys.size, lick).toBe(12);
			}
		}
	);
});
