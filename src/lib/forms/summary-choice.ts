import { z } from 'zod';

/**
 * The settings form of the Weekly class summary, shared by the page and its action: whether it
 * comes, and on which day of the week (ISO weekday, 1 Monday … 7 Sunday).
 */
export const WEEKDAYS = [
	'Monday',
	'Tuesday',
	'Wednesday',
	'Thursday',
	'Friday',
	'Saturday',
	'Sunday'
] as const;

export const summaryChoiceSchema = z.object({
	summaryEnabled: z.boolean().default(true),
	summaryWeekday: z
		.number({ error: 'Choose a day of the week.' })
		.int('Choose a day of the week.')
		.min(1, 'Choose a day of the week.')
		.max(7, 'Choose a day of the week.')
		.default(1)
});

export type SummaryChoice = z.infer<typeof summaryChoiceSchema>;
