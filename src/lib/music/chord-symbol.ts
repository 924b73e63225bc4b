/**
 * Jazz chord symbols: `<note><accidental><type></bass>` (abc 2.1 §4.18, read liberally), reduced to
 * the qualities the engine re-maps over.
 *
 * Reductions (common practice; a lead sheet's symbol names a family more than a voicing):
 * - a plain major triad, `add9`, `maj9`, `maj13`, `maj7#11` → maj7; `6`, `69`, `6/9` → 6;
 * - a minor triad and `m9`, `m11`, `m13`, `m7b9` → m7; `m6`, `m69` → m6; `ø`, `m7b5`, `m9b5` → m7b5;
 * - `o`, `dim`, `o7`, `dim7` → dim7 (a bare diminished triad in a jazz chart usually means dim7);
 * - `7`, `9`, `13` and their b9, 9, #11, 13 colours → 7; any #5, b5, #9, b13, `+` or `alt` → 7alt;
 * - `sus`, `sus4`, `7sus4`, `9sus`, `13sus`, and `11` (no third, as tonal 6.5.1 reads it) → 7sus4;
 * - minor-major, augmented triads, `sus2`, power chords and anything else → null.
 */
import { ChordType } from 'tonal';
import { LETTERS, type SpelledNote } from './pitch';
import { QUALITY_ROWS } from './qualities-data';
import type { ChordContext, NoteName, QualityId } from './types';

/** A parsed chord symbol: the chord in force plus its type text as written. */
export type ParsedChordSymbol = ChordContext & {
	/** What follows the root and precedes the bass, as written: `m7b5` in `Cm7b5/Gb`. */
	suffix: string;
};

const ROOT = /^([A-G])(#|b|♯|♭)?/u;
const BASS = /^([A-G])(#|b|♯|♭)?$/u;

function accidental(text: string | undefined): string {
	if (text === '♯') return '#';
	if (text === '♭') return 'b';
	return text ?? '';
}

/**
 * Rewrite the many ways of writing a chord type into one spelling (`-7` → `m7`, `Δ` → `maj`).
 * @example normaliseChordSuffix('MA7(#11)') // 'maj7#11'
 */
export function normaliseChordSuffix(suffix: string): string {
	let s = suffix
		.replace(/[\s(),]/g, '')
		.replace(/♯/g, '#')
		.replace(/♭/g, 'b')
		.replace(/[–−]/g, '-');
	s = s.replace(/ø7?/g, 'm7b5').replace(/[Δ^]/g, 'maj').replace(/°/g, 'o');
	s = s.replace(/^(MAJ|Maj|maj|MA|Ma|ma)/, 'maj').replace(/^M(?=$|[0-9#b])/, 'maj');
	s = s
		.replace(/^(min|mi|-)/, 'm')
		.replace(/dim/g, 'o')
		.replace(/aug/g, '+');
	s = s.replace(/^m(Maj|MAJ|maj|MA|Ma|ma|M)/, 'mmaj').replace(/7-5/g, '7b5');
	return s.replace(/^majmaj/, 'maj');
}

const TYPE_WORDS =
	/maj|Maj|MAJ|ma|Ma|MA|min|mi|m|M|dim|aug|sus|add|alt|o|ø|°|Δ|\^|\+|-|–|−|#|b|♯|♭|\d+|\/|\(|\)|,|\s/gu;

const ALTERED = /#5|\+|b5|#9|b13|alt/;

/**
 * The quality a chord type reduces to, or null.
 * @example reduceQuality('-7') // 'm7'
 */
export function reduceQuality(suffix: string): QualityId | null {
	const s = normaliseChordSuffix(suffix);
	if (/^m(7|9|11)?b5/.test(s)) return 'm7b5';
	if (s.startsWith('mmaj')) return null;
	if (/^m6/.test(s)) return 'm6';
	if (/^m(?!aj)/.test(s)) return 'm7';
	if (/^o/.test(s)) return 'dim7';
	if (/^6(9|\/9|add9)?$/.test(s)) return '6';
	if (/sus2/.test(s)) return null;
	if (/sus/.test(s) || /^11$/.test(s)) return '7sus4';
	if (/^alt$/.test(s) || /^(7|9|13)?alt/.test(s)) return '7alt';
	if (/^(\+7|7\+)/.test(s)) return '7alt';
	if (/^(7|9|13)/.test(s)) return ALTERED.test(s) ? '7alt' : '7';
	if (s === '' || s === 'add9' || s === '2' || s.startsWith('maj')) {
		return /#5|\+/.test(s) ? null : 'maj7';
	}
	return null;
}

/**
 * Read a chord symbol; null when it is not one (an annotation, `N.C.`, a root outside A–G).
 * @example parseChordSymbol('Bb7#11/D') // { root: 'Bb', suffix: '7#11', quality: '7', bass: 'D', … }
 */
export function parseChordSymbol(text: string): ParsedChordSymbol | null {
	const symbol = text.trim();
	let body = symbol;
	// An alternative chord in parentheses, "(G7)", reads as its content.
	if (body.startsWith('(') && body.endsWith(')')) body = body.slice(1, -1).trim();
	const root = ROOT.exec(body);
	if (!root) return null;
	let rest = body.slice(root[0].length);
	let bass: NoteName | null = null;
	const slash = rest.lastIndexOf('/');
	if (slash >= 0) {
		const b = BASS.exec(rest.slice(slash + 1).trim());
		if (b) {
			bass = b[1] + accidental(b[2]);
			rest = rest.slice(0, slash);
		}
	}
	const suffix = rest.trim();
	// Anything but chord-type words after the root means prose ("Coda"), not a symbol.
	if (suffix.replace(TYPE_WORDS, '') !== '') return null;
	return {
		symbol,
		root: root[1] + accidental(root[2]),
		quality: reduceQuality(suffix),
		bass,
		suffix
	};
}

/** Suffixes that say no more than their table quality: the table's chord tones describe them. */
const PLAIN: Readonly<Record<string, QualityId>> = {
	'7': '7',
	m7: 'm7',
	maj7: 'maj7',
	m7b5: 'm7b5',
	o7: 'dim7',
	// tonal's 7alt is 1 3 #5 b7 #9 only; the altered scale of the table says more.
	'7alt': '7alt',
	'6': '6',
	m6: 'm6',
	'7sus4': '7sus4'
};

/**
 * The chord tones a chord type names, as intervals above its root: the quality table's for the
 * nine table qualities, else tonal 6.5.1's chord dictionary (`ChordType.get`), which knows `7#9`,
 * `mMaj7`, `13`, `7b13`…; empty for a type neither knows.
 * @example chordToneIntervals('mMaj7') // ['1P', '3m', '5P', '7M']
 */
export function chordToneIntervals(suffix: string): readonly string[] {
	const normal = normaliseChordSuffix(suffix);
	const plain = PLAIN[normal];
	if (plain) return TABLE_TONES.get(plain) ?? [];
	return ChordType.get(normal === '' ? 'M' : normal.replace(/^mmaj/, 'mMaj')).intervals;
}

/** Whether a chord type is one of the table's own (its chord tones say nothing more). */
export function isPlainChordSuffix(suffix: string): boolean {
	return PLAIN[normaliseChordSuffix(suffix)] !== undefined;
}

const TABLE_TONES = new Map<QualityId, readonly string[]>(
	QUALITY_ROWS.map((r) => [r.id, r.chordTones])
);

const ROOT_RE = /(^|[\s/(,|])([A-G])(##|bb|#|b|♯|♭)?/g;
const ALT_TEXT: Record<string, number> = { '': 0, '#': 1, '##': 2, b: -1, bb: -2, '♯': 1, '♭': -1 };

/** A chord symbol cut at its roots: text pieces around each root or bass note. */
export interface ChordTemplate {
	/** One more piece than roots: pieces[0] root[0] pieces[1] root[1] … */
	pieces: string[];
	roots: SpelledNote[];
	/** Index in `roots` of a bass note after a slash at the end, or -1. */
	bass: number;
}

const templates = new Map<string, ChordTemplate>();

/**
 * Cut a chord symbol at its roots once; transposing it is then string joins (no regex per variant).
 * @example chordTemplate('Bb7/D') // { pieces: ['', '7/', ''], roots: [Bb, D], bass: 1 }
 */
export function chordTemplate(symbol: string): ChordTemplate {
	let t = templates.get(symbol);
	if (t) return t;
	const pieces: string[] = [];
	const roots: SpelledNote[] = [];
	let last = 0;
	let bass = -1;
	for (const m of symbol.matchAll(ROOT_RE)) {
		const at = (m.index ?? 0) + m[1].length;
		pieces.push(symbol.slice(last, at));
		roots.push({ letter: LETTERS.indexOf(m[2]), alt: ALT_TEXT[m[3] ?? ''] });
		last = at + m[2].length + (m[3]?.length ?? 0);
		if (m[1] === '/' && /^\s*\)?\s*$/.test(symbol.slice(last))) bass = roots.length - 1;
	}
	pieces.push(symbol.slice(last));
	t = { pieces, roots, bass };
	// Licks hold a handful of symbols; a long-running server must not keep every one it has seen.
	if (templates.size > 2000) templates.clear();
	templates.set(symbol, t);
	return t;
}

/**
 * Write a chord symbol back from its parts (ASCII accidentals, as abc 2.1 §4.18 writes them).
 * @example formatChordSymbol({ root: 'Bb', suffix: '7#11', bass: 'D' }) // 'Bb7#11/D'
 */
export function formatChordSymbol(parts: {
	root: NoteName;
	suffix: string;
	bass?: NoteName | null;
}): string {
	return parts.root + parts.suffix + (parts.bass ? '/' + parts.bass : '');
}
