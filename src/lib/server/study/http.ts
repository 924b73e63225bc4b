import { apiError } from '../http/json';
import { StudyError } from './cards';

/**
 * A study service's refusal as the JSON error answer; anything else is rethrown (a real fault).
 * @example try { … } catch (e) { return studyRefusal(e) }
 */
export function studyRefusal(error: unknown): Response {
	if (error instanceof StudyError) {
		if (error.status === 503) {
			const wait = error.retryAfterSeconds ?? 1;
			return apiError(
				503,
				error.message,
				{ retryAfterSeconds: wait },
				{ 'Retry-After': String(wait) }
			);
		}
		return apiError(error.status, error.message, error.field ? { field: error.field } : {});
	}
	throw error;
}
