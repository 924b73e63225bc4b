/**
 * Note and chord names in a teacher's prose (a lick's teaching note), moved into the key a learner
 * is shown: "the B♭ is the ♭7" over C7 reads "the E♭ is the ♭7" over F7. A name moves by the
 * interval between the two tonics, letter by letter, so it keeps its degree (B♭, the ♭7 of C,
 * becomes F♭ in G♭, not E).
 *
 * Only what cannot be a word is moved: a letter A–G with an accidental (B♭, Bb, F♯, F#) or with a
 * chord suffix (C7, Dm7, E♭maj7, G7♭9). A bare capital letter is left as written and counted, for
 * "A" and "E" are words too ("A chromatic approach", "E.g."), so the screen can say that such
 * letters are still in the home key.
 */
import { formatNoteName, parseNoteName, stepsBetween } from './pitch';
import { transposeNoteName } from './transpose';

export interface NoteText {
	/** The text with every name it recognised moved into the other key. */
	text: string;
	/** How many names were moved. */
	moved: number;
	/** Bare capital letters A–G left as written (they may be words), besides the article "A". */
	bareLetters: number;
}

const ACCIDENTALS = '𝄫|𝄪|♭♭|♯♯|bb|##|♭|♯|b|#';
const SUFFIX = '(?:maj|min|m|dim|aug|sus|alt|ø|°|\\+|Δ|△)?\\d*(?:(?:♭|♯|b|#)\\d+)*';
// Not inside a word on either side (Ebony, Dorian, ABC stay as they are).
const NAME = new RegExp(
	`(?<![\\p{L}\\p{N}])([A-G])(${ACCIDENTALS})?(${SUFFIX})(?![\\p{L}\\p{N}])`,
	'gu'
);
// "A" followed by a word in lower case reads as the article, not a note.
const ARTICLE = /^A\s+\p{Ll}/u;

const ASCII_ALTERATION: Record<string, string> = {
	'𝄫': 'bb',
	'𝄪': '##',
	'♭♭': 'bb',
	'♯♯': '##',
	'♭': 'b',
	'♯': '#'
};

/** An ASCII name written with the signs ♭ and ♯ (double ones doubled). */
const withSigns = (name: string) => name.replace(/b/g, '♭').replace(/#/g, '♯');

/**
 * The names in `text` moved from the key whose tonic is `from` to the key whose tonic is `to`
 * (pitch classes such as `C`, `Bb`, `F#`). A name keeps the way it was written: with signs
 * (B♭) or with letters (Bb). Unknown tonics leave the text as it is.
 * @example respellNoteText('the B♭ is the ♭7 of C7', 'C', 'F').text // 'the E♭ is the ♭7 of F7'
 */
export function respellNoteText(text: string, from: string, to: string): NoteText {
	const source = parseNoteName(from);
	const target = parseNoteName(to);
	let moved = 0;
	let bareLetters = 0;
	if (!source || !target) return { text, moved, bareLetters };
	const by = stepsBetween(source, target);
	const signs = /[♭♯]/.test(text);
	const out = text.replace(
		NAME,
		(whole: string, letter: string, accidental: string | undefined, suffix: string, at: number) => {
			if (!accidental && !suffix) {
				if (!(letter === 'A' && ARTICLE.test(text.slice(at)))) bareLetters += 1;
				return whole;
			}
			const written = accidental ? (ASCII_ALTERATION[accidental] ?? accidental) : '';
			const note = parseNoteName(letter + written);
			if (!note) return whole;
			moved += 1;
			const name = formatNoteName(transposeNoteName(note, by));
			const useSigns = accidental ? /[♭♯]|𝄫|𝄪/u.test(accidental) : signs;
			return (useSigns ? withSigns(name) : name) + suffix;
		}
	);
	return { text: out, moved, bareLetters };
}
