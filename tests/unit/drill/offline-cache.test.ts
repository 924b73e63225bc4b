import { describe, expect, it } from 'vitest';
import { isDrillPath, isSignOut } from '../../../src/lib/drill/offline-cache';

describe('the offline copy', () => {
	it.each([
		['/drill', true],
		['/drill/__data.json', true],
		['/api/drill/today', true],
		['/api/drill/reviews', false],
		['/drill/other', false],
		['/home', false],
		['/', false]
	])('keeps %s offline: %s', (path, kept) => {
		expect(isDrillPath(path)).toBe(kept);
	});

	it.each([
		['POST', '/sign-out', true],
		['POST', '/api/auth/sign-out', true],
		['GET', '/sign-out', false],
		['POST', '/sign-in', false]
	])('%s %s empties it: %s', (method, path, empties) => {
		expect(isSignOut(method, path)).toBe(empties);
	});
});
