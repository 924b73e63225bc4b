import { describe, expect, it } from 'vitest';
import { MAX_ABC_BYTES, tokenize, type Token } from '../../../../src/lib/music/abc/tokenize';

const HEAD = 'X:1\nT:Test\nM:4/4\nL:1/8\nK:C\n';
const body = (music: string): Token[] => {
	const r = tokenize(HEAD + music);
	if (!r.ok) throw new Error(r.error.message);
	return r.tokens.filter((t) => t.line === 6);
};
const kinds = (music: string) => body(music).map((t) => [t.kind, t.text]);
const error = (text: string) => {
	const r = tokenize(text);
	if (r.ok) throw new Error('expected an error');
	return r.error;
};

describe('abc tokenizer', () => {
	it('keeps every character, so joining the tokens gives the input back', () => {
		const input =
			'%abc-2.1\nX:1 % number\nT:Lick\nM:4/4\nL:1/8\nK:Bb clef=treble\n"Bb7"!trill!B,2 (3DF_A .c>d [CEG]2- | [K:G]{/g}f4 z2 "^solo"x2 :|\\\n% between\n|: a\'b,, ~c/ d// e3/2 |]\r\n\nX:2\nK:D\nF\n';
		const r = tokenize(input);
		expect(r.ok).toBe(true);
		if (r.ok) expect(r.tokens.map((t) => t.text).join('')).toBe(input);
	});

	it.each([
		['^c', [['note', '^c']]],
		['__B,,3/2', [['note', '__B,,3/2']]],
		['=f//', [['note', '=f//']]],
		[
			'z2 x/ Z4',
			[
				['rest', 'z2'],
				['space', ' '],
				['rest', 'x/'],
				['space', ' '],
				['rest', 'Z4']
			]
		],
		[
			'a>b',
			[
				['note', 'a'],
				['broken-rhythm', '>'],
				['note', 'b']
			]
		],
		[
			'a<<b',
			[
				['note', 'a'],
				['broken-rhythm', '<<'],
				['note', 'b']
			]
		],
		[
			'c4-c',
			[
				['note', 'c4'],
				['tie', '-'],
				['note', 'c']
			]
		],
		[
			'(3cde',
			[
				['tuplet', '(3'],
				['note', 'c'],
				['note', 'd'],
				['note', 'e']
			]
		],
		[
			'(3:2:4c',
			[
				['tuplet', '(3:2:4'],
				['note', 'c']
			]
		],
		[
			'(cd)',
			[
				['slur-open', '('],
				['note', 'c'],
				['note', 'd'],
				['slur-close', ')']
			]
		],
		[
			'{/g}a',
			[
				['grace-open', '{/'],
				['note', 'g'],
				['grace-close', '}'],
				['note', 'a']
			]
		],
		[
			'!trill!c',
			[
				['decoration', '!trill!'],
				['note', 'c']
			]
		],
		[
			'+fermata+c',
			[
				['decoration', '+fermata+'],
				['note', 'c']
			]
		],
		[
			'.~Tc',
			[
				['decoration', '.'],
				['decoration', '~'],
				['decoration', 'T'],
				['note', 'c']
			]
		],
		[
			'[CEG]2',
			[
				['chord-open', '['],
				['note', 'C'],
				['note', 'E'],
				['note', 'G'],
				['chord-close', ']2']
			]
		],
		[
			'"Am7"A',
			[
				['chord-symbol', '"Am7"'],
				['note', 'A']
			]
		],
		[
			'"^solo"A',
			[
				['annotation', '"^solo"'],
				['note', 'A']
			]
		],
		[
			'"_below"A',
			[
				['annotation', '"_below"'],
				['note', 'A']
			]
		],
		[
			'[K:G]a',
			[
				['inline-field', '[K:G]'],
				['note', 'a']
			]
		],
		[
			'|:a:|',
			[
				['bar', '|:'],
				['note', 'a'],
				['bar', ':|']
			]
		],
		[
			'a||b|]',
			[
				['note', 'a'],
				['bar', '||'],
				['note', 'b'],
				['bar', '|]']
			]
		],
		[
			'[|a::b',
			[
				['bar', '[|'],
				['note', 'a'],
				['bar', '::'],
				['note', 'b']
			]
		],
		[
			'|1a:|2b',
			[
				['bar', '|1'],
				['note', 'a'],
				['bar', ':|2'],
				['note', 'b']
			]
		],
		[
			'[1a',
			[
				['bar', '[1'],
				['note', 'a']
			]
		],
		[
			'a % note',
			[
				['note', 'a'],
				['space', ' '],
				['comment', '% note']
			]
		],
		[
			'a \\',
			[
				['note', 'a'],
				['space', ' '],
				['continuation', '\\']
			]
		],
		[
			'y`$a',
			[
				['ignored', 'y'],
				['ignored', '`'],
				['ignored', '$'],
				['note', 'a']
			]
		]
	])('reads %j', (music, expected) => {
		expect(kinds(music)).toEqual(expected);
	});

	it('reads chord symbols and annotations apart (abc 2.1 §4.18, §4.19)', () => {
		const [sym, , ann] = body('"Bb7#11/D"A"@here"B');
		expect(sym).toMatchObject({ kind: 'chord-symbol', value: 'Bb7#11/D' });
		expect(ann).toMatchObject({ kind: 'annotation', value: '@here' });
	});

	it('gives note parts and positions', () => {
		const note = body("  _b'3/2").find((t) => t.kind === 'note');
		expect(note).toMatchObject({
			accidental: '_',
			letter: 'b',
			octave: "'",
			length: '3/2',
			line: 6,
			column: 3
		});
	});

	it('warns about reserved characters and unknown decoration letters but goes on (abc 2.1 §8.1, §4.16)', () => {
		const r = tokenize(HEAD + 'a#b Jc\n');
		expect(r.ok).toBe(true);
		if (r.ok) expect(r.warnings.map((w) => w.column)).toEqual([2, 5]);
	});

	it('warns when an empty line cuts the music off (abc 2.1 §2.2: an empty line ends the tune)', () => {
		const r = tokenize(HEAD + 'ab\n\ncd\n');
		expect(r.ok && r.warnings.map((w) => [w.line, w.message.includes('empty line')])).toEqual([
			[8, true]
		]);
		expect(r.ok && r.tokens.filter((t) => t.kind === 'note').length).toBe(2);
		// free text before the first tune is fine and silent
		const before = tokenize('Some notes about the file\n\n' + HEAD + 'ab\n');
		expect(before.ok && before.warnings).toEqual([]);
	});

	it('keeps a comment line inside a tune and keeps the tune going (abc 2.1 §2.2.5)', () => {
		const r = tokenize(HEAD + 'ab\n% comment\ncd\n');
		expect(r.ok && r.tokens.filter((t) => t.kind === 'note').length).toBe(4);
		expect(r.ok && r.tokens.some((t) => t.kind === 'blank')).toBe(false);
	});

	it.each([
		[HEAD + 'a "C7 b', 6, 3, /no closing double quote/],
		[HEAD + 'a [CE b', 6, 3, /never closed/],
		[HEAD + 'a ] b', 6, 3, /closes nothing/],
		[HEAD + '[C[E]]', 6, 3, /inside another chord/],
		[HEAD + '[CzE]', 6, 3, /Only notes/],
		[HEAD + 'a {g b', 6, 3, /never closed/],
		[HEAD + 'a } b', 6, 3, /closes no grace/],
		[HEAD + 'a !trill b', 6, 3, /no closing !/],
		[HEAD + 'a ^ b', 6, 3, /accidental/],
		[HEAD + 'a 3 b', 6, 3, /no note before it/],
		[HEAD + "a ' b", 6, 3, /octave mark/],
		[HEAD + 'a & b', 6, 3, /Voice overlay/],
		[HEAD + 'a \\ b', 6, 3, /backslash/],
		[HEAD + 'a [K:G b', 6, 3, /no closing \]/],
		[HEAD + 'a (1b', 6, 3, /tuplet/],
		[HEAD + 'ab €', 6, 4, /Unexpected character “€”/],
		['X:1\nT:t\nabc\nK:C\n', 3, 1, /before the K: line/]
	])('refuses malformed abc with a positioned sentence (%#)', (text, line, column, message) => {
		const e = error(text);
		expect([e.line, e.column]).toEqual([line, column]);
		expect(e.message).toMatch(message);
	});

	it('refuses input over 20 KB (20 × 1024 bytes of UTF-8) and accepts exactly 20 KB', () => {
		const at = HEAD + 'C'.repeat(MAX_ABC_BYTES - HEAD.length);
		expect(tokenize(at).ok).toBe(true);
		expect(error(at + 'C').message).toMatch(/20 KB/);
		// a multi-byte character counts as its UTF-8 bytes
		expect(error(HEAD + '"' + 'é'.repeat(10300) + '"C').message).toMatch(/at most 20 KB/);
	});
});
