/**
 * Words for drill times: when a lick comes back, how long a sitting has run. Pure.
 */

/**
 * When something due at `due` comes back, seen from `now`, in the fewest words.
 * @example comesBackIn('2026-03-01T19:10:00Z', new Date('2026-03-01T19:00:00Z')) // 'in 10 min'
 */
export function comesBackIn(due: string | undefined, now: Date): string {
	if (!due) return '';
	const ms = Date.parse(due) - now.getTime();
	if (Number.isNaN(ms)) return '';
	const minutes = Math.round(ms / 60_000);
	if (minutes < 1) return 'now';
	if (minutes < 60) return `in ${minutes} min`;
	const hours = Math.round(minutes / 60);
	if (hours < 20) return `in ${hours} h`;
	const days = Math.round(hours / 24);
	if (days <= 1) return 'tomorrow';
	if (days < 45) return `in ${days} days`;
	const months = Math.round(days / 30.44);
	if (months < 18) return `in ${months} mo`;
	return `in ${Math.round(days / 365.25)} yr`;
}

/**
 * Whether to suggest a break: `minutes` of playing since the sitting started or the last break.
 * @example breakDue(new Date('2026-03-01T19:00:00Z'), new Date('2026-03-01T19:26:00Z')) // true
 */
export function breakDue(since: Date, now: Date, minutes = 25): boolean {
	return now.getTime() - since.getTime() >= minutes * 60_000;
}

/**
 * What the drill says under a teaching note about the key its names are in: the note is
 * written about the lick's own key, and the server moves what it safely can into the prompt's.
 * Null when there is nothing to say.
 * @example noteNamesLine('moved', 'Eb') // 'Note names moved to Eb, the key of this prompt.'
 */
export function noteNamesLine(
	noteNames: 'moved' | 'some-moved' | 'home' | 'none',
	writtenKey: string
): string | null {
	switch (noteNames) {
		case 'moved':
			return `Note names moved to ${writtenKey}, the key of this prompt.`;
		case 'some-moved':
			return `Names with a sharp, a flat or a chord symbol are moved to ${writtenKey}; single letters stay as written, in the lick's own key.`;
		case 'home':
			return "Single note letters here are as written, in the lick's own key.";
		case 'none':
			return null;
	}
}
