/**
 * Re-emit a parsed tune with new keys, pitches and chord symbols. Every token that carries no
 * pitch is copied byte for byte. Accidentals are written so that the output reads the same
 * whether an accidental reaches the same letter in every octave of its bar (abc 2.1 §11.3,
 * `%%propagate-accidentals pitch`, the default) or only the same letter in the same octave
 * (`octave`, engraving practice): a note gets an accidental whenever either reading would
 * otherwise sound a different pitch, which is also the fewest accidentals both readings accept.
 */
import { formatKeyField, type KeySignature } from '../keys';
import { abcLetter, type SpelledNote, type SpelledPitch, type Steps } from '../pitch';
import { simplifyNoteName } from '../spelling';
import { transposeNoteName } from '../transpose';
import type { ParsedAbc } from './parse';

export interface EmitPlan {
	/** The new key for each entry of `tune.keys`. */
	keys: readonly KeySignature[];
	/** The new pitch for each entry of `tune.heads`. */
	pitches: readonly SpelledPitch[];
	/** The new text (without quotes) for each entry of `tune.chordSymbols`. */
	chordSymbols: readonly string[];
}

const UNSET = 99;
const ACCIDENTAL_TEXT: Record<number, string> = { [-2]: '__', [-1]: '_', 0: '=', 1: '^', 2: '^^' };

/**
 * Write abc text for a tune under a plan.
 * @example emitAbc(tune, plan) // 'X:1\nK:D\n^c d|'
 */
export function emitAbc(tune: ParsedAbc, plan: EmitPlan): string {
	const { tokens, propagation } = tune;
	const byLetter = new Int8Array(7).fill(UNSET);
	// Letter and octave: octaves -1..12 are plenty for any instrument.
	const byOctave = new Int8Array(7 * 16).fill(UNSET);
	const touched: number[] = [];
	const resetBar = () => {
		byLetter.fill(UNSET);
		for (const i of touched) byOctave[i] = UNSET;
		touched.length = 0;
	};
	let out = '';
	let headIndex = 0;
	let chordIndex = 0;
	let keyIndex = 0;
	for (let ti = 0; ti < tokens.length; ti++) {
		const t = tokens[ti];
		switch (t.kind) {
			case 'note': {
				const p = plan.pitches[headIndex];
				const head = tune.heads[headIndex++];
				const sig = plan.keys[head.key].accidentals[p.letter];
				const slot = p.letter + 7 * Math.min(15, Math.max(0, p.octave + 1));
				let needs: boolean;
				if (propagation === 'not') needs = p.alt !== sig;
				else {
					const l = byLetter[p.letter];
					const o = byOctave[slot];
					const readPitch = l === UNSET ? sig : l;
					const readOctave = o === UNSET ? sig : o;
					needs = readPitch !== p.alt || readOctave !== p.alt;
				}
				let acc = '';
				if (needs) {
					acc = ACCIDENTAL_TEXT[p.alt];
					if (acc === undefined) throw new RangeError(`Cannot write alteration ${p.alt} in abc`);
					if (propagation !== 'not') {
						byLetter[p.letter] = p.alt;
						if (byOctave[slot] === UNSET) touched.push(slot);
						byOctave[slot] = p.alt;
					}
				}
				// An unchanged note keeps its own text (`b,,` stays `b,,`, not `B,`).
				const q = head.pitch;
				if (acc === t.accidental && q.letter === p.letter && q.alt === p.alt && q.octave === p.octave) {
					out += t.text;
				} else out += acc + abcLetter(p) + (t.length as string);
				break;
			}
			case 'bar':
				resetBar();
				out += t.text;
				break;
			case 'blank':
				resetBar();
				out += t.text;
				break;
			case 'field':
			case 'inline-field': {
				if (t.name === 'K') {
					const original = tune.keys[keyIndex].key;
					const key = plan.keys[keyIndex++];
					if (formatKeyField(original) === formatKeyField(key)) out += t.text;
					else if (t.kind === 'field') out += 'K:' + formatKeyField(key);
					else out += '[K:' + formatKeyField(key) + ']';
				} else {
					if (t.name === 'X') resetBar();
					out += t.text;
				}
				break;
			}
			case 'chord-symbol':
				out += '"' + plan.chordSymbols[chordIndex++] + '"';
				break;
			default:
				out += t.text;
		}
	}
	return out;
}

const ROOT_RE = /(^|[\s/(,|])([A-G])(##|bb|#|b|♯|♭)?/g;
const ALT_TEXT: Record<string, number> = { '': 0, '#': 1, '##': 2, b: -1, bb: -2, '♯': 1, '♭': -1 };
const LETTER_NAMES = 'CDEFGAB';

/**
 * Transpose the roots and bass notes of a chord symbol and spell them for the key; everything
 * else in the symbol (quality, alterations, brackets) is kept as written (abc 2.1 §4.18).
 * @example transposeChordSymbol('Bb7(#11)/D', { steps: 1, semitones: 2 }, keyOf('C').accidentals) // 'C7(#11)/E'
 */
export function transposeChordSymbol(
	symbol: string,
	by: Steps,
	accidentals: readonly number[]
): string {
	if (by.semitones === 0 && by.steps === 0) return symbol;
	return symbol.replace(ROOT_RE, (_m, lead: string, letter: string, acc: string | undefined) => {
		const root: SpelledNote = { letter: LETTER_NAMES.indexOf(letter), alt: ALT_TEXT[acc ?? ''] };
		const moved = simplifyNoteName(transposeNoteName(root, by), accidentals);
		return lead + LETTER_NAMES[moved.letter] + (moved.alt > 0 ? '#'.repeat(moved.alt) : 'b'.repeat(-moved.alt));
	});
}
