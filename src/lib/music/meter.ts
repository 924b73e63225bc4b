/**
 * Meter and tempo as a lick states them (abc 2.1 §3.1.6 `M:`, §3.1.8 `Q:`): the one place that
 * reads them. The engine's answer carries what it read, so screens need not read the text again.
 */

/**
 * Quarter-note beats a minute from the value of a `Q:` field (`1/4=120`, `3/8=40`, or a bare
 * number read as quarters); null when it names none.
 * @example readTempo('1/2=60') // 120
 */
export function readTempo(value: string): number | null {
	const m = /^\s*(?:"[^"]*"\s*)?(?:(\d+)\/(\d+)\s*=\s*)?(\d+)\s*(?:"[^"]*")?\s*$/.exec(value);
	if (!m) return null;
	const bpm = Number(m[3]);
	// A tempo given for another beat (Q:3/8=40) becomes quarters a minute.
	const beat = m[1] ? Number(m[1]) / Number(m[2]) : 0.25;
	const quarters = (bpm * beat) / 0.25;
	return Number.isFinite(quarters) && quarters > 0 ? Math.round(quarters) : null;
}

/**
 * Beats of a count-in bar for a meter: the numerator in x/4, the dotted-quarter pulse in
 * compound x/8, two per half in x/2; `C`, `C|`, `none` and anything odd count four (common
 * practice).
 * @example beatsPerBar('6/8') // 2
 */
export function beatsPerBar(meter: string): number {
	const v = meter.trim();
	if (v === 'C' || v === 'C|') return 4;
	const [num, den] = v.split('/').map(Number);
	if (!(num > 0 && num <= 12)) return 4;
	if (den === 4) return num;
	if (den === 8) return num % 3 === 0 ? num / 3 : num;
	if (den === 2) return num * 2;
	return 4;
}
