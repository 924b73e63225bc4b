/**
 * The home key and chord quality of a lick, as the editor offers them: read from the abc (its K:
 * line and its first chord symbol) unless the author overrides them. In the editor an empty
 * choice means "as the abc reads it"; only an override is sent, so that the server reads the abc
 * again on every save and a changed K: line or first chord carries through.
 */

/** The editor's home fields: '' follows the abc, anything else overrides it. */
export interface HomeChoice {
	homeKey: string;
	homeQuality: string;
}

/**
 * The editor's choice for a stored value: '' when it is what the abc reads anyway.
 * @example homeChoice('Bb', 'Bb') // ''; homeChoice('G', 'C') // 'G'
 */
export function homeChoice(stored: string, readFromAbc: string | null | undefined): string {
	return readFromAbc !== null && readFromAbc !== undefined && stored === readFromAbc ? '' : stored;
}

/**
 * The home fields of a save body: overrides only.
 * @example homeBody({ homeKey: '', homeQuality: 'm7' }) // { homeQuality: 'm7' }
 */
export function homeBody(choice: HomeChoice): Partial<HomeChoice> {
	const body: Partial<HomeChoice> = {};
	if (choice.homeKey) body.homeKey = choice.homeKey;
	if (choice.homeQuality) body.homeQuality = choice.homeQuality;
	return body;
}
