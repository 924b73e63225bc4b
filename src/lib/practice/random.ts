/**
 * Seeded randomness for the practice core: the same seed gives the same draws, so a queue, a key
 * pick or a test repeats exactly. Nothing here reads a clock or `Math.random`.
 */

/**
 * A 32-bit hash of a string (FNV-1a), the seed of `seededRandom`.
 * @example hashSeed('card-1:3') // 2915040235
 */
export function hashSeed(text: string): number {
	let h = 0x811c9dc5;
	for (let i = 0; i < text.length; i++) {
		h ^= text.charCodeAt(i);
		h = Math.imul(h, 0x01000193);
	}
	return h >>> 0;
}

/**
 * A generator of numbers in [0, 1) from a string seed (mulberry32 over the FNV-1a hash).
 * @example const next = seededRandom('a'); next() // 0.11… the same every run
 */
export function seededRandom(seed: string): () => number {
	let state = hashSeed(seed);
	return () => {
		state = (state + 0x6d2b79f5) >>> 0;
		let t = state;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/**
 * Index drawn with probability proportional to its weight; -1 when no weight is positive.
 * @example pickWeighted([0, 1, 0], () => 0.5) // 1
 */
export function pickWeighted(weights: readonly number[], random: () => number): number {
	let total = 0;
	for (const w of weights) if (w > 0) total += w;
	if (!(total > 0)) return -1;
	let r = random() * total;
	for (let i = 0; i < weights.length; i++) {
		if (!(weights[i] > 0)) continue;
		r -= weights[i];
		if (r < 0) return i;
	}
	for (let i = weights.length - 1; i >= 0; i--) if (weights[i] > 0) return i;
	return -1;
}
