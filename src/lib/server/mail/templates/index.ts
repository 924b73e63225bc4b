export {
	verificationMail,
	passwordResetMail,
	passwordChangedMail,
	type AccountMailInput,
	type PasswordChangedMailInput
} from './account';
export { classInvitationMail, type ClassInvitationMailInput } from './class';
export {
	renderMail,
	checkMailUrl,
	MailTemplateError,
	type MailContent,
	type MailBlock,
	type MailLayoutInput
} from './layout';
export { escapeHtml } from './escape';
