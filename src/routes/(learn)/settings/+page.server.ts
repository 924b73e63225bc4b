import { redirect } from '@sveltejs/kit';
import { changePasswordSchema, deleteAccountSchema } from '$lib/forms/account';
import { settingsSchema, summaryChoiceSchema } from '$lib/practice/settings';
import { changePassword } from '$lib/server/auth/password';
import { requireUser } from '$lib/server/auth/guard';
import { deleteSessionCookie } from '$lib/server/auth/session';
import { deleteAccount } from '$lib/server/auth/user';
import {
	emptyForm,
	filledForm,
	readForm,
	unreadable,
	refuse,
	refuseField,
	say
} from '$lib/server/forms';
import { updateSettings } from '$lib/server/study/settings';
import { readMailChoices, setSummaryChoice } from '$lib/server/digest/choices';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const user = requireUser();
	// The Weekly class summary is a teacher's mail; learners see only the Daily reminder.
	const teaches = user.role === 'teacher' || user.role === 'admin';
	const choices = teaches ? await readMailChoices(user.id) : null;
	return {
		summaryForm: choices
			? await filledForm(
					summaryChoiceSchema,
					{ summaryEnabled: choices.summaryEnabled, summaryWeekday: choices.summaryWeekday },
					'summary'
				)
			: null,
		account: {
			name: user.name,
			email: user.email,
			role: user.role,
			emailVerified: user.emailVerified
		},
		practice: await filledForm(settingsSchema, user.settings, 'practice'),
		password: await emptyForm(changePasswordSchema, 'password'),
		deletion: await emptyForm(deleteAccountSchema, 'delete'),
		changed: url.searchParams.get('changed')
	};
};

export const actions: Actions = {
	practice: async ({ request }) => {
		const user = requireUser();
		const form = await readForm(request, settingsSchema, 'practice');
		if (!form) return unreadable(settingsSchema, 'practice');
		// The typed values go back with the refusal, so the form shows what was sent.
		if (!form.valid) return refuse(form);
		const result = await updateSettings(user.id, form.data);
		if (!result.ok) {
			if (result.reason === 'invalid') return refuseField(form, result.field, result.message);
			return say(form, result.message, 404);
		}
		redirect(303, '/settings?changed=practice');
	},

	summary: async ({ request }) => {
		const user = requireUser();
		const form = await readForm(request, summaryChoiceSchema, 'summary');
		if (!form) return unreadable(summaryChoiceSchema, 'summary');
		if (user.role !== 'teacher' && user.role !== 'admin') {
			return say(form, 'The Weekly class summary is for teachers.', 403);
		}
		if (!form.valid) return refuse(form);
		await setSummaryChoice(user.id, form.data);
		redirect(303, '/settings?changed=summary');
	},

	password: async ({ request, locals }) => {
		const user = requireUser();
		const form = await readForm(request, changePasswordSchema, 'password');
		if (!form) return unreadable(changePasswordSchema, 'password');
		const secrets = ['currentPassword', 'password', 'confirm'] as const;
		if (!form.valid) return refuse(form, ...secrets);
		const result = await changePassword(user.id, form.data, locals.session?.id);
		if (!result.ok) {
			if (result.reason === 'invalid') {
				return refuseField(form, result.field, result.message, 422, ...secrets);
			}
			return say(form, result.message, result.reason === 'conflict' ? 409 : 404, ...secrets);
		}
		redirect(303, '/settings?changed=password');
	},

	delete: async ({ request, cookies }) => {
		const user = requireUser();
		const form = await readForm(request, deleteAccountSchema, 'delete');
		if (!form) return unreadable(deleteAccountSchema, 'delete');
		if (!form.valid) return refuse(form, 'deletePassword');
		const result = await deleteAccount(user, form.data);
		if (!result.ok) {
			if (result.reason === 'invalid') {
				return refuseField(form, result.field, result.message, 422, 'deletePassword');
			}
			return say(form, result.message, 404, 'deletePassword');
		}
		deleteSessionCookie(cookies);
		redirect(303, '/?farewell');
	}
};
