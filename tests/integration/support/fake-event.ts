/**
 * Just enough of a SvelteKit RequestEvent to call hooks and endpoint handlers as plain functions.
 */
export interface StoredCookie {
	value: string;
	options: Record<string, unknown>;
}

export class FakeCookies {
	readonly jar = new Map<string, StoredCookie>();
	get(name: string): string | undefined {
		return this.jar.get(name)?.value;
	}
	getAll() {
		return [...this.jar].map(([name, c]) => ({ name, value: c.value }));
	}
	set(name: string, value: string, options: Record<string, unknown>): void {
		this.jar.set(name, { value, options });
	}
	delete(name: string, options: Record<string, unknown>): void {
		this.jar.set(name, { value: '', options: { ...options, maxAge: 0 } });
	}
	serialize(): string {
		return '';
	}
}

export interface FakeEventInput {
	method?: string;
	path?: string;
	routeId?: string | null;
	/** An object is sent as JSON; a string as is. */
	body?: unknown;
	contentType?: string | null;
	cookies?: FakeCookies;
	address?: string;
	locals?: App.Locals;
}

export function fakeEvent(input: FakeEventInput = {}) {
	const {
		method = 'GET',
		path = '/',
		routeId = null,
		body,
		contentType = body === undefined ? null : 'application/json',
		cookies = new FakeCookies(),
		address = '203.0.113.7',
		locals = { user: null, session: null }
	} = input;
	const url = new URL(path, 'http://twelvefold.test');
	const headers = new Headers();
	if (contentType) headers.set('content-type', contentType);
	const request = new Request(url, {
		method,
		headers,
		body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body)
	});
	/** What the handler set with `setHeaders`, as Kit would add it to the answer. */
	const sentHeaders: Record<string, string> = {};
	return {
		sentHeaders,
		request,
		url,
		cookies,
		locals,
		params: {},
		route: { id: routeId },
		isDataRequest: false,
		isSubRequest: false,
		isRemoteRequest: false,
		platform: undefined,
		getClientAddress: () => address,
		setHeaders: (headers: Record<string, string>) => Object.assign(sentHeaders, headers),
		fetch: globalThis.fetch,
		tracing: { enabled: false, root: undefined, current: undefined }
	};
}
