/**
 * The account services in one import, for callers that use several. Each concern has its file:
 * `user.ts` (the session user, sign-up, deletion, roles), `password.ts` (hashing, sign-in,
 * change), `email-token.ts` (mailed single-use links), `verification.ts` (confirming an
 * address), `reset.ts` (a forgotten password).
 */
export {
	toSessionUser,
	signUp,
	deleteAccount,
	setRole,
	makeAdmin,
	type SessionUser,
	type SignUpInput,
	type SignUpResult,
	type DeleteAccountResult,
	type SetRoleResult,
	type Invalid,
	type AccountField
} from './user';
export {
	signIn,
	changePassword,
	type SignInInput,
	type SignInResult,
	type ChangePasswordResult
} from './password';
export { TOKEN_LIFETIME_MS, type TokenProblem } from './email-token';
export { resendVerification, verifyEmail, type VerifyEmailResult } from './verification';
export { requestPasswordReset, resetPassword, type ResetPasswordResult } from './reset';
export { normalizeEmail, SIGN_UP_ROLES } from '../../forms/account';
