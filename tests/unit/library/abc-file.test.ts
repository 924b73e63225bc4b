import { describe, expect, it } from 'vitest';
import {
	readHeaderField,
	readTempo,
	readTuneMeta,
	setHeaderField,
	splitTunes,
	writeTunes
} from '../../../src/lib/library/abc-file';

describe('splitTunes', () => {
	it('splits a file at X: lines and ends a tune at an empty line (abc 2.1 §2.2)', () => {
		const file =
			'free text before\n\nX:1\nT:One\nK:C\nc\n\nignored text\nX:7\nK:G\n% a comment line\nG';
		expect(splitTunes(file)).toEqual([
			{ text: 'X:1\nT:One\nK:C\nc', line: 3, number: 1 },
			{ text: 'X:7\nK:G\n% a comment line\nG', line: 9, number: 7 }
		]);
	});

	it.each([
		['', 0],
		['no tunes at all', 0],
		['\uFEFFX:1\r\nK:C\r\nc', 1]
	])('finds the tunes of %j', (file, count) => {
		expect(splitTunes(file)).toHaveLength(count);
	});

	it('numbers a tune whose X: is not a number by its place in the file', () => {
		expect(splitTunes('X:1\nK:C\nc\n\nX:?\nK:C\nd')[1].number).toBe(2);
	});
});

describe('header fields', () => {
	it.each([
		['X:1\nT:Old\nK:C\nc', 'T', 'New', 'X:1\nT:New\nK:C\nc'],
		['X:1\nK:C\nc', 'T', 'Up', 'X:1\nT:Up\nK:C\nc'],
		['X:1\nT:a\nK:C\nc', 'Q', '1/4=90', 'X:1\nT:a\nQ:1/4=90\nK:C\nc'],
		// A T: after K: (a part title in the body) is not the header's.
		['X:1\nK:C\nT:part\nc', 'T', 'Up', 'X:1\nT:Up\nK:C\nT:part\nc']
	])('setHeaderField(%j, %s, %s)', (abc, field, value, out) => {
		expect(setHeaderField(abc, field, value)).toBe(out);
	});

	it('reads the header only', () => {
		expect(readHeaderField('X:1\nK:C\nT:part\nc', 'T')).toBeNull();
		expect(readHeaderField('X:1\nT: Blue turn \nK:C', 'T')).toBe('Blue turn');
	});

	// abc 2.1 §3.1.8: Q: gives a beat length and beats a minute; a bare number is read as quarters here.
	it.each([
		['Q:1/4=132', 132],
		['Q:3/8=60', 90],
		['Q:1/2=60', 120],
		['Q:120', 120],
		['Q:"Allegro" 1/4=140', 140],
		['Q:fast', null]
	])('reads %s as %s quarter notes a minute', (q, bpm) => {
		expect(readTempo(`X:1\n${q}\nK:C\nc`)).toBe(bpm);
	});
});

describe('export meta', () => {
	it('writes a lick and its versions as tunes that read back to the same fields', () => {
		const { text, next } = writeTunes(
			{
				title: 'Up',
				abc: 'X:1\nT:old\nK:C\n"C7"c',
				tags: ['arpeggio', 'blues'],
				feel: 1.5,
				note: 'Line one.\n\n- two'
			},
			{ m7: 'X:1\nK:C\n"Cm7"c' },
			4
		);
		expect(next).toBe(6);
		const tunes = splitTunes(text);
		expect(tunes.map((t) => t.number)).toEqual([4, 5]);
		const main = readTuneMeta(tunes[0].text);
		expect(main.abc).toBe('X:1\nT:Up\nK:C\n"C7"c');
		expect(main.meta).toEqual({
			tags: ['arpeggio', 'blues'],
			feel: 1.5,
			note: 'Line one.\n\n- two',
			versionOf: null
		});
		const version = readTuneMeta(tunes[1].text);
		expect(version.abc).toBe('X:1\nK:C\n"Cm7"c');
		expect(version.meta.versionOf).toEqual({ tune: 4, quality: 'm7' });
	});

	it('keeps N: lines after K: (notes in the music) in the abc', () => {
		expect(readTuneMeta('X:1\nN:header note\nK:C\nN:body note\nc')).toMatchObject({
			abc: 'X:1\nK:C\nN:body note\nc',
			meta: { note: 'header note' }
		});
	});
});
