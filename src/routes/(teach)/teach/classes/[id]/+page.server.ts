import { error, fail } from '@sveltejs/kit';
import { message } from 'sveltekit-superforms';
import { requireRole } from '$lib/server/auth/guard';
import {
	assignableDecks,
	createAssignment,
	deleteAssignment,
	listAssignments,
	updateAssignment
} from '$lib/server/classes/assignments';
import { getClass, updateClass } from '$lib/server/classes/classes';
import type { Refusal } from '$lib/server/classes/common';
import { inviteByEmail, listInvitations } from '$lib/server/classes/invitations';
import { listMembers, removeMember } from '$lib/server/classes/members';
import { classProgress } from '$lib/server/classes/progress';
import { classLimits, readFields, refuseForm } from '$lib/server/classes/http';
import { emptyForm, filledForm, readForm, say, unreadable } from '$lib/server/forms';
import { assignSchema, classNameSchema, inviteSchema, paceSchema } from '$lib/forms/classes';
import { practiceDay } from '$lib/practice/day';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	const user = requireRole('teacher', 'admin');
	const got = await getClass(user, params.id);
	if (!got.ok || got.class.as !== 'teacher') error(404, 'No such class among yours.');
	const query = {
		assignmentId: url.searchParams.get('assignment') || undefined,
		sort: url.searchParams.get('sort') || undefined,
		dir: url.searchParams.get('dir') || undefined
	};
	let progress = await classProgress(user, params.id, query);
	// A stale link (a removed assignment, a made-up column) falls back to the whole class by name.
	if (!progress.ok) progress = await classProgress(user, params.id);
	const [members, invitations, assignments, decks] = await Promise.all([
		listMembers(user, params.id),
		listInvitations(user, params.id),
		listAssignments(user, params.id),
		assignableDecks(user)
	]);
	const today = practiceDay(new Date(), user.settings.timezone, 4);
	return {
		cls: got.class,
		members: members.ok ? members.items : [],
		invitations: invitations.ok ? invitations.items.filter((i) => !i.acceptedAt) : [],
		assignments: assignments.ok ? assignments.items : [],
		decks,
		progress: progress.ok ? progress : null,
		renameForm: await filledForm(classNameSchema, { name: got.class.name }, 'rename'),
		inviteForm: await emptyForm(inviteSchema, 'invite'),
		assignForm: await filledForm(
			assignSchema,
			{ deckId: decks[0]?.id ?? '', startDate: today, newPerDay: '2' },
			'assign'
		),
		/** Blank: each assignment's pace form fills it with its own values and id. */
		paceForm: await emptyForm(paceSchema)
	};
};

/** A refusal of one of the buttons (no fields of its own): said at the top of the page. */
function refused(result: Refusal) {
	const status = { 'not-found': 404, forbidden: 403, conflict: 409, invalid: 422 }[result.reason];
	return fail(status, { message: result.message });
}

export const actions: Actions = {
	rename: async ({ request, params }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readForm(request, classNameSchema, 'rename');
		if (!form) return unreadable(classNameSchema, 'rename');
		const result = await updateClass(user, params.id, { name: form.data.name });
		return result.ok ? message(form, 'Renamed.') : refuseForm(form, result);
	},
	archive: async ({ params }) => {
		const user = requireRole('teacher', 'admin');
		const result = await updateClass(user, params.id, { archived: true });
		return result.ok
			? { done: 'Archived: its assignments are paused and nobody can join.' }
			: refused(result);
	},
	restore: async ({ params }) => {
		const user = requireRole('teacher', 'admin');
		const result = await updateClass(user, params.id, { archived: false });
		return result.ok
			? { done: 'Restored. Resume its assignments when you want new licks to flow again.' }
			: refused(result);
	},
	joining: async ({ request, params }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readFields(request);
		const change = form?.what === 'link' ? { joinLink: form?.to } : { joinCode: form?.to };
		const result = await updateClass(user, params.id, change);
		return result.ok ? { done: 'Saved.' } : refused(result);
	},
	invite: async ({ request, params, setHeaders }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readForm(request, inviteSchema, 'invite');
		if (!form) return unreadable(inviteSchema, 'invite');
		const limit = await classLimits.invite(user.id);
		if (!limit.allowed) {
			setHeaders({ 'Retry-After': String(limit.retryAfterSeconds) });
			return say(
				form,
				`Too many invitations; try again in ${Math.ceil(limit.retryAfterSeconds / 60)} minutes.`,
				429
			);
		}
		const result = await inviteByEmail(user, params.id, { email: form.data.email });
		if (!result.ok) return refuseForm(form, result);
		return message(
			form,
			result.mailSent
				? `Invitation sent to ${result.invitation.email}.`
				: `The invitation to ${result.invitation.email} is saved, but the mail could not be sent just now.`
		);
	},
	remove: async ({ request, params }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readFields(request);
		const result = await removeMember(user, params.id, form?.userId);
		return result.ok
			? { done: 'Removed from the class. Their practice history stays with them.' }
			: refused(result);
	},
	assign: async ({ request, params }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readForm(request, assignSchema, 'assign');
		if (!form) return unreadable(assignSchema, 'assign');
		if (!form.valid) return fail(422, { form });
		const { keyChoice, keys, ...rest } = form.data;
		const result = await createAssignment(user, params.id, {
			...rest,
			keys: keyChoice === 'all' ? undefined : keys,
			targetTempo: rest.targetTempo || null,
			endDate: rest.endDate || null
		});
		if (!result.ok) return refuseForm(form, result);
		return message(form, `${result.assignment.deckName} assigned.`);
	},
	pause: async ({ request }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readFields(request);
		const result = await updateAssignment(user, form?.assignmentId, {
			paused: form?.paused === 'true'
		});
		return result.ok
			? { done: result.assignment.paused ? 'Paused.' : 'Resumed.' }
			: refused(result);
	},
	edit: async ({ request }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readForm(request, paceSchema);
		if (!form) return unreadable(paceSchema);
		const result = await updateAssignment(user, form.data.assignmentId, {
			newPerDay: form.data.newPerDay,
			targetTempo: form.data.targetTempo || null,
			endDate: form.data.endDate || null
		});
		return result.ok ? message(form, 'Assignment saved.') : refuseForm(form, result);
	},
	unassign: async ({ request }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readFields(request);
		const result = await deleteAssignment(user, form?.assignmentId);
		return result.ok
			? {
					done: `Assignment removed; ${result.retired} licks not yet started will not arrive. Practised ones stay with the learners.`
				}
			: refused(result);
	}
};
