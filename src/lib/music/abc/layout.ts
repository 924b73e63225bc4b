/**
 * Layout of abc text for a narrow screen: a new music line every few bars (abc 2.1 §2.2.6: a
 * line break in the tune body starts a new staff line). A renderer that draws tablature under
 * each staff line then keeps it on every line, which its own automatic wrapping does not.
 */
import { tokenize } from './tokenize';

/**
 * The abc with a line break after every `barsPerLine` bars of music (and none after a line's
 * last bar). Text that does not tokenize comes back unchanged.
 * @example wrapBars('X:1\nK:C\nCD|EF|GA|B2|]', 2) // 'X:1\nK:C\nCD|EF|\nGA|B2|]'
 */
export function wrapBars(abc: string, barsPerLine: number): string {
	const result = tokenize(abc);
	if (!result.ok || barsPerLine < 1) return abc;
	const { tokens } = result;
	let out = '';
	let inBody = false;
	let bars = 0;
	for (let i = 0; i < tokens.length; i++) {
		const t = tokens[i];
		if (t.kind === 'field' && t.name === 'K') inBody = true;
		if (t.kind === 'blank') inBody = false;
		if (t.kind === 'newline') bars = 0;
		// Spaces after a break would start the next line with a gap: drop them.
		if (t.kind === 'space' && out.endsWith('\n') && inBody) continue;
		out += t.text;
		if (!inBody || t.kind !== 'bar') continue;
		bars++;
		if (bars < barsPerLine) continue;
		// Only where music follows on the same line: a bar that ends its line needs no break.
		let next = i + 1;
		while (next < tokens.length && tokens[next].kind === 'space') next++;
		const after = tokens[next];
		if (!after || after.kind === 'newline' || after.kind === 'blank' || after.kind === 'comment')
			continue;
		out += '\n';
		bars = 0;
	}
	return out;
}
