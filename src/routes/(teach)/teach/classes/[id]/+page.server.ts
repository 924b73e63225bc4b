import { error, fail } from '@sveltejs/kit';
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
import { classLimits, readFields } from '$lib/server/classes/http';
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
	return {
		cls: got.class,
		members: members.ok ? members.items : [],
		invitations: invitations.ok ? invitations.items.filter((i) => !i.acceptedAt) : [],
		assignments: assignments.ok ? assignments.items : [],
		decks,
		progress: progress.ok ? progress : null,
		today: practiceDay(new Date(), user.settings.timezone, 4)
	};
};

function refused(result: Refusal, extra: Record<string, unknown> = {}) {
	const status = { 'not-found': 404, forbidden: 403, conflict: 409, invalid: 422 }[result.reason];
	return fail(status, {
		...extra,
		message: result.message,
		field: 'field' in result ? result.field : null
	});
}

async function formData(request: Request): Promise<FormData | null> {
	try {
		return await request.formData();
	} catch {
		return null;
	}
}

export const actions: Actions = {
	rename: async ({ request, params }) => {
		const user = requireRole('teacher', 'admin');
		const form = await readFields(request);
		const result = await updateClass(user, params.id, { name: form?.name });
		return result.ok ? { done: 'Renamed.' } : refused(result, { form: 'rename' });
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
		const form = await readFields(request);
		const limit = await classLimits.invite(user.id);
		if (!limit.allowed) {
			setHeaders({ 'Retry-After': String(limit.retryAfterSeconds) });
			return fail(429, {
				form: 'invite',
				email: form?.email ?? '',
				message: `Too many invitations; try again in ${Math.ceil(limit.retryAfterSeconds / 60)} minutes.`,
				field: null
			});
		}
		const result = await inviteByEmail(user, params.id, { email: form?.email });
		if (!result.ok) return refused(result, { form: 'invite', email: form?.email ?? '' });
		return {
			done: result.mailSent
				? `Invitation sent to ${result.invitation.email}.`
				: `The invitation to ${result.invitation.email} is saved, but the mail could not be sent just now.`
		};
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
		const data = await formData(request);
		if (!data)
			return fail(400, { form: 'assign', message: 'The form could not be read.', field: null });
		const keys = data.getAll('keys').map(String);
		const input = {
			deckId: data.get('deckId'),
			startDate: data.get('startDate'),
			newPerDay: data.get('newPerDay'),
			keys: keys.length === 0 || keys.length === 12 ? undefined : keys,
			qualities: data.getAll('qualities').map(String),
			targetTempo: data.get('targetTempo') || null,
			endDate: data.get('endDate') || null
		};
		if (keys.length === 0) {
			return fail(422, { form: 'assign', message: 'Tick at least one key.', field: 'keys' });
		}
		const result = await createAssignment(user, params.id, input);
		if (!result.ok) return refused(result, { form: 'assign' });
		return { done: `${result.assignment.deckName} assigned.` };
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
		const form = await readFields(request);
		const result = await updateAssignment(user, form?.assignmentId, {
			newPerDay: form?.newPerDay,
			targetTempo: form?.targetTempo || null,
			endDate: form?.endDate || null
		});
		return result.ok
			? { done: 'Assignment saved.' }
			: refused(result, { form: `edit-${form?.assignmentId}` });
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
