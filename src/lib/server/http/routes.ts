/**
 * The app's own routes, read from the files under `src/routes` when the server is built, so
 * that the edge knows, for any route id, whether it is a JSON/endpoint route and which form
 * actions its page declares, without a list that someone must remember to update.
 */

type PageServerModule = { actions?: Record<string, unknown> };

const pageServers = import.meta.glob<PageServerModule>('/src/routes/**/+page*.server.ts');
const endpoints = import.meta.glob('/src/routes/**/+server.ts');

/** `/src/routes/(auth)/sign-in/+page.server.ts` → `/(auth)/sign-in` (Kit's route id). */
export function routeIdOfFile(file: string): string {
	const dir = file.replace(/^\/src\/routes/, '').replace(/\/\+[^/]+$/, '');
	return dir === '' ? '/' : dir;
}

const pageServerByRoute = new Map(
	Object.entries(pageServers).map(([file, load]) => [routeIdOfFile(file), load])
);
const endpointRoutes = new Set(Object.keys(endpoints).map(routeIdOfFile));

/** True when the route has a `+server.ts` (JSON endpoints and the like). */
export function isEndpointRoute(routeId: string | null): boolean {
	return routeId !== null && endpointRoutes.has(routeId);
}

/** True when the route's page has a `+page.server.ts` (where form actions live). */
export function hasPageServer(routeId: string | null): boolean {
	return routeId !== null && pageServerByRoute.has(routeId);
}

/**
 * The names of the actions the route's page declares itself (own properties holding a
 * function), or null when the page declares none; inherited names such as `toString` or
 * `__proto__` are never among them.
 */
export async function ownActionNames(routeId: string | null): Promise<string[] | null> {
	const load = routeId === null ? undefined : pageServerByRoute.get(routeId);
	if (!load) return null;
	const { actions } = await load();
	if (!actions || typeof actions !== 'object') return null;
	return Object.keys(actions).filter(
		(name) => Object.hasOwn(actions, name) && typeof actions[name] === 'function'
	);
}

/**
 * The action a POST asks for, read as SvelteKit reads it: the first query parameter whose name
 * starts with `/` (`?/setRole`), else `default`. `?/default` is returned as `/default`, because
 * Kit refuses that spelling of the default action (with a 500) rather than running it.
 * @example requestedActionName(new URL('http://x.test/admin?/setRole')) // 'setRole'
 */
export function requestedActionName(url: URL): string {
	for (const [name] of url.searchParams) {
		if (name.startsWith('/')) return name === '/default' ? '/default' : name.slice(1);
	}
	return 'default';
}

const pages = new Set(
	Object.keys(import.meta.glob('/src/routes/**/+page*.svelte')).map(routeIdOfFile)
);

/** True when the route renders a page (`+page.svelte`) and has no endpoint beside it. */
export function isPageRoute(routeId: string | null): boolean {
	return routeId !== null && pages.has(routeId) && !endpointRoutes.has(routeId);
}
