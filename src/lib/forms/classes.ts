import { z } from 'zod';

/**
 * The class forms, one schema per form, shared by the page and its action. The rules on these
 * fields (a class name's length, a join code's letters, an assignment's dates and pace) are the
 * class services' own, because the JSON API takes the same fields: a schema here only gives a
 * form its shape (typed values kept on failure), and the action puts a service's refusal beside
 * the field it names. The limits live here so the inputs can hint them (min, max, maxlength).
 */

export const MAX_CLASS_NAME = 120;
export const NEW_PER_DAY_MAX = 50;
export const TEMPO_MIN = 20;
export const TEMPO_MAX = 400;
export const MAX_COMMENT = 2000;

/** A text field as a form posts it: missing reads as empty, for the service to refuse. */
const field = () => z.string().default('');

/** Create a class, or rename one. */
export const classNameSchema = z.object({ name: field() });

/** A learner joins with the code their teacher handed out. */
export const joinCodeSchema = z.object({ code: field() });

/** Invite someone to a class by e-mail. */
export const inviteSchema = z.object({ email: field() });

/**
 * Assign a deck. `keyChoice` is the form's own switch between all twelve keys and the ticked ones;
 * the API says the same by leaving `keys` out.
 */
export const assignSchema = z
	.object({
		deckId: field(),
		startDate: field(),
		newPerDay: z.string().default('2'),
		targetTempo: field(),
		endDate: field(),
		keyChoice: z.enum(['all', 'some']).default('all'),
		keys: z.array(z.string()).default([]),
		qualities: z.array(z.string()).default([])
	})
	.refine((form) => form.keyChoice === 'all' || form.keys.length > 0, {
		path: ['keys'],
		message: 'Tick at least one key.'
	});

/** Change an assignment's pace: how many new licks a day, the target tempo, the end date. */
export const paceSchema = z.object({
	assignmentId: field(),
	newPerDay: field(),
	targetTempo: field(),
	endDate: field()
});

/** A teacher's comment on a learner's lick. */
export const commentSchema = z.object({ cardId: field(), text: field() });

export type AssignForm = z.infer<typeof assignSchema>;
export type PaceForm = z.infer<typeof paceSchema>;
