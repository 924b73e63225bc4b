import { describe, expect, test } from 'vitest';
import { homeBody, homeChoice } from '../../../src/lib/library/home';

describe('the editor’s home key and quality', () => {
	test('a stored value the abc reads anyway shows as "as the abc reads it"; another one as an override', () => {
		expect(homeChoice('Bb', 'Bb')).toBe('');
		expect(homeChoice('G', 'C')).toBe('G');
		expect(homeChoice('m7', '7')).toBe('m7');
		// Nothing read (a stored lick that no longer reads): the stored value is shown as chosen.
		expect(homeChoice('F', null)).toBe('F');
		expect(homeChoice('7', undefined)).toBe('7');
	});

	test('only overrides are sent, so the server reads the abc again for the rest', () => {
		expect(homeBody({ homeKey: '', homeQuality: '' })).toEqual({});
		expect(homeBody({ homeKey: 'G', homeQuality: '' })).toEqual({ homeKey: 'G' });
		expect(homeBody({ homeKey: '', homeQuality: 'm7' })).toEqual({ homeQuality: 'm7' });
	});
});
