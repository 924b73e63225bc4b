import { z } from 'zod';

/**
 * The library's form schemas, one per form, shared by the page (client hints) and its action.
 */

export const IMPORT_MAX_BYTES = 1024 * 1024;

/** Import: one `.abc` file up to 1 MB. */
export const importSchema = z.object({
	file: z
		.instanceof(File, { message: 'Choose an .abc file to import.' })
		.refine((f) => f.size > 0, 'That file is empty.')
		.refine((f) => f.size <= IMPORT_MAX_BYTES, 'An import file is at most 1 MB.')
});

/** A deck's name and description (create and rename). */
export const deckSchema = z.object({
	name: z
		.string()
		.trim()
		.min(1, 'Give the deck a name.')
		.max(120, 'A deck name has at most 120 characters.'),
	description: z
		.string()
		.trim()
		.max(2000, 'A description has at most 2,000 characters.')
		.default('')
});
