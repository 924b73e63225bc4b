import { render } from 'svelte/server';
import { describe, expect, test } from 'vitest';
import FieldNotes from '../../../../src/lib/components/form/FieldNotes.svelte';
import { describedBy, fieldIds, firstError } from '../../../../src/lib/components/form/field';

describe('what a form field says under itself', () => {
	test.each([
		['email', true, true, 'email-error email-hint'],
		['email', true, false, 'email-error'],
		['email', false, true, 'email-hint'],
		['email', false, false, undefined]
	])(
		'%s with an error %s and a hint %s is described by %j (the error is read first)',
		(id, hasError, hasHint, expected) => {
			expect(describedBy(id, hasError, hasHint)).toBe(expected);
		}
	);

	test.each([
		[undefined, null],
		[[], null],
		[['Use at least 10 characters.', 'Mix two kinds.'], 'Use at least 10 characters.']
	])('of the errors %j the field shows %j', (errors, shown) => {
		expect(firstError(errors)).toBe(shown);
	});

	test('the hint and the error carry the ids the control points at', () => {
		const { body } = render(FieldNotes, {
			props: { inputId: 'timezone', hint: 'A region and city.', error: 'Not a zone.' }
		});
		const ids = fieldIds('timezone');
		expect(body).toContain(`id="${ids.hint}"`);
		expect(body).toContain(`id="${ids.error}"`);
		expect(body.indexOf('A region and city.')).toBeLessThan(body.indexOf('Not a zone.'));
	});

	test('without an error nothing but the hint is drawn', () => {
		const { body } = render(FieldNotes, { props: { inputId: 'name', error: null } });
		expect(body).not.toContain('<p');
	});
});
