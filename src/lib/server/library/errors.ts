import { apiError, type ApiErrorDetails } from '../http/json';

/**
 * A refusal from a library service: the status a route answers with and a sentence for the
 * person. Services throw it; routes turn it into the `{error:{message,…}}` answer with
 * `libraryErrorResponse`, so no route decides who may touch a row.
 */
export class LibraryError extends Error {
	constructor(
		readonly status: 400 | 403 | 404 | 409 | 413 | 415 | 416 | 422 | 503,
		message: string,
		readonly details: ApiErrorDetails = {}
	) {
		super(message);
		this.name = 'LibraryError';
	}
}

/** The same sentence for a lick that does not exist and one the person may not see. */
export const lickNotFound = () => new LibraryError(404, 'No such lick in your library.');
export const deckNotFound = () => new LibraryError(404, 'No such deck.');

/**
 * The JSON answer for a service's refusal; anything else is rethrown (a real fault, a 500).
 * @example libraryErrorResponse(new LibraryError(404, 'No such lick.')) // 404 response
 */
export function libraryErrorResponse(e: unknown): Response {
	if (e instanceof LibraryError) return answerOf(e);
	throw e;
}

/** The answer for a refusal; a busy engine (503) says when to come back. */
export function answerOf(e: LibraryError): Response {
	const wait = e.details.retryAfterSeconds;
	return apiError(
		e.status,
		e.message,
		e.details,
		wait ? { 'Retry-After': String(wait) } : undefined
	);
}
