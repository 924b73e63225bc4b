/**
 * Re-emit a parsed tune with new keys, pitches and chord symbols. Every token that carries no
 * pitch is copied byte for byte. Accidentals are written so that the output reads the same
 * whether an accidental reaches the same letter in every octave of its bar (abc 2.1 §11.3,
 * `%%propagate-accidentals pitch`, the default) or only the same letter in the same octave
 * (`octave`, engraving practice): a note gets an accidental whenever either reading would
 * otherwise sound a different pitch, which is also the fewest accidentals both readings accept.
 */
import { formatKeyField, type KeySignature } from '../keys';
import {
	abcLetter,
	chromaOf,
	formatNoteName,
	LETTER_SEMITONES,
	mod12,
	stepsBetween,
	type SpelledNote,
	type SpelledPitch,
	type Steps
} from '../pitch';
import { simplifyNoteName, spellingCost } from '../spelling';
import { transposeNoteName } from '../transpose';
import { chordTemplate, type ChordTemplate } from '../chord-symbol';
import type { ParsedAbc } from './parse';

export { chordTemplate, type ChordTemplate };

export interface EmitPlan {
	/** The new key for each entry of `tune.keys`. */
	keys: readonly KeySignature[];
	/** The new pitch for each entry of `tune.heads`. */
	pitches: readonly SpelledPitch[];
	/** The new text (without quotes) for each entry of `tune.chordSymbols`. */
	chordSymbols: readonly string[];
}

const UNSET = 99;
/** abc accidentals for alterations -2..+2 (index alt + 2). */
const ACCIDENTAL_TEXT: readonly string[] = ['__', '_', '=', '^', '^^'];

/** What the emitter does at each step: copy text, write a note, a chord symbol or a key, or start a bar. */
const enum Step {
	Text,
	Note,
	Chord,
	Key,
	Bar
}

/**
 * A tune cut once into the parts a variant changes and the text between them (merged), so that
 * each variant is a short walk instead of one step per token.
 */
interface Skeleton {
	steps: Step[];
	/** Per step: the text to copy (Text), or the index of the head, chord symbol or key. */
	args: (string | number)[];
}

const skeletons = new WeakMap<ParsedAbc, Skeleton>();

/** Accidental in force per letter in the bar, and per letter and octave (octaves -1..14). */
const BY_LETTER = new Int8Array(7);
const BY_OCTAVE = new Int8Array(7 * 16);
/** Slots of BY_OCTAVE set in the bar (each at most once per bar). */
const TOUCHED = new Int16Array(7 * 16);

function skeletonOf(tune: ParsedAbc): Skeleton {
	let sk = skeletons.get(tune);
	if (sk) return sk;
	const steps: Step[] = [];
	const args: (string | number)[] = [];
	let text = '';
	const flush = () => {
		if (text) {
			steps.push(Step.Text);
			args.push(text);
			text = '';
		}
	};
	let head = 0;
	let chord = 0;
	let key = 0;
	for (const t of tune.tokens) {
		if (t.kind === 'note') {
			flush();
			steps.push(Step.Note);
			args.push(head++);
		} else if (t.kind === 'chord-symbol') {
			flush();
			steps.push(Step.Chord);
			args.push(chord++);
		} else if ((t.kind === 'field' || t.kind === 'inline-field') && t.name === 'K') {
			flush();
			steps.push(Step.Key);
			args.push(key++);
		} else {
			text += t.text;
			if (t.kind === 'bar' || t.kind === 'blank' || (t.kind === 'field' && t.name === 'X')) {
				flush();
				steps.push(Step.Bar);
				args.push(0);
			}
		}
	}
	flush();
	sk = { steps, args };
	skeletons.set(tune, sk);
	return sk;
}

/**
 * Write abc text for a tune under a plan.
 * @example emitAbc(tune, plan) // 'X:1\nK:D\n^c d|'
 */
export function emitAbc(tune: ParsedAbc, plan: EmitPlan): string {
	const { tokens, propagation, heads } = tune;
	const { steps, args } = skeletonOf(tune);
	// Scratch state shared by every call (emitting is synchronous): a grid emits a hundred
	// variants, and fresh typed arrays for each cost more than the walk itself.
	const byLetter = BY_LETTER.fill(UNSET);
	const byOctave = BY_OCTAVE.fill(UNSET);
	const touched = TOUCHED;
	let touchedCount = 0;
	let out = '';
	for (let si = 0; si < steps.length; si++) {
		switch (steps[si]) {
			case Step.Text:
				out += args[si] as string;
				break;
			case Step.Note: {
				const hi = args[si] as number;
				const p = plan.pitches[hi];
				const head = heads[hi];
				const t = tokens[head.token];
				const sig = plan.keys[head.key].accidentals[p.letter];
				const slot = p.letter + 7 * Math.min(15, Math.max(0, p.octave + 1));
				let needs: boolean;
				if (propagation === 'not') needs = p.alt !== sig;
				else {
					const l = byLetter[p.letter];
					const o = byOctave[slot];
					needs = (l === UNSET ? sig : l) !== p.alt || (o === UNSET ? sig : o) !== p.alt;
				}
				let acc = '';
				if (needs) {
					acc = ACCIDENTAL_TEXT[p.alt + 2];
					if (acc === undefined) throw new RangeError(`Cannot write alteration ${p.alt} in abc`);
					if (propagation !== 'not') {
						byLetter[p.letter] = p.alt;
						if (byOctave[slot] === UNSET) touched[touchedCount++] = slot;
						byOctave[slot] = p.alt;
					}
				}
				// An unchanged note keeps its own text (`b,,` stays `b,,`, not `B,`).
				const q = head.pitch;
				if (t.kind !== 'note')
					throw new RangeError('A note head points at a token that is no note');
				if (
					acc === t.accidental &&
					q.letter === p.letter &&
					q.alt === p.alt &&
					q.octave === p.octave
				) {
					out += t.text;
				} else out += acc + abcLetter(p) + t.length;
				break;
			}
			case Step.Chord:
				out += '"' + plan.chordSymbols[args[si] as number] + '"';
				break;
			case Step.Key: {
				const ki = args[si] as number;
				const original = tune.keys[ki].key;
				const key = plan.keys[ki];
				const t = tokens[tune.keys[ki].token];
				if (key === original || formatKeyField(original) === formatKeyField(key)) out += t.text;
				else if (t.kind === 'field') out += 'K:' + formatKeyField(key);
				else out += '[K:' + formatKeyField(key) + ']';
				break;
			}
			case Step.Bar:
				byLetter.fill(UNSET);
				for (let i = 0; i < touchedCount; i++) byOctave[touched[i]] = UNSET;
				touchedCount = 0;
				break;
		}
	}
	return out;
}

/**
 * Transpose the roots and bass notes of a chord symbol and spell them for the key; everything
 * else in the symbol (quality, alterations, brackets) is kept as written (abc 2.1 §4.18).
 * @example transposeChordSymbol('Bb7(#11)/D', { steps: 1, semitones: 2 }, keyOf('C').accidentals) // 'C7(#11)/E'
 */
export function transposeChordSymbol(
	symbol: string,
	by: Steps,
	accidentals: readonly number[],
	moved?: SpelledNote[]
): string {
	const t = chordTemplate(symbol);
	const names: SpelledNote[] = t.roots.map((r) =>
		simplifyNoteName(transposeNoteName(r, by), accidentals)
	);
	// A slash bass keeps its interval name from its chord's root (E7/G# a tone up is F#7/A#, not
	// F#7/Bb); where that needs an awkward letter, the root and bass move together to the
	// enharmonic pair that is cheaper to read (G#7/B# or Ab7/C), the asked spelling on a tie.
	if (t.bass > 0) spellSlash(t, names, accidentals);
	let out = t.pieces[0];
	for (let i = 0; i < names.length; i++) {
		if (moved) moved.push(names[i]);
		out += formatNoteName(names[i]) + t.pieces[i + 1];
	}
	return out;
}

function spellSlash(t: ChordTemplate, names: SpelledNote[], accidentals: readonly number[]): void {
	const r = t.bass - 1;
	const iv = stepsBetween(t.roots[r], t.roots[t.bass]);
	let best: { root: SpelledNote; bass: SpelledNote; cost: number } | null = null;
	for (const d of [0, -1, 1]) {
		const root = names[r];
		const letter = (root.letter + d + 7) % 7;
		const alt = d === 0 ? root.alt : mod12(chromaOf(root) - LETTER_SEMITONES[letter] + 6) - 6;
		if (alt > 1 || alt < -1) continue;
		const candidate = { letter, alt };
		const bass = transposeNoteName(candidate, iv);
		if (bass.alt > 2 || bass.alt < -2) continue;
		const cost =
			spellingCost(letter, alt, accidentals) + spellingCost(bass.letter, bass.alt, accidentals);
		if (!best || cost < best.cost) best = { root: candidate, bass, cost };
	}
	if (best) {
		names[r] = best.root;
		names[t.bass] = best.bass;
	}
}
