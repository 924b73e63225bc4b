import { describe, expect, it } from 'vitest';
import { createMessageId, isMessageId } from '$lib/server/mail/message-id';

describe('outbox message ids', () => {
	it('start with the UTC arrival time and sort in arrival order within one millisecond', () => {
		const at = Date.UTC(2031, 0, 2, 3, 4, 5, 678);
		const ids = [createMessageId(at), createMessageId(at), createMessageId(at - 5)];
		expect(ids[0].slice(0, 19)).toBe('20310102T030405678Z');
		expect(ids.map((id) => id.slice(0, 19))).toEqual([
			'20310102T030405678Z',
			'20310102T030405679Z',
			'20310102T030405680Z'
		]);
		expect([...ids].sort()).toEqual(ids);
		for (const id of ids) expect(isMessageId(id)).toBe(true);
	});

	it.each([
		['20261201T215845123Z-3fa9c1', true],
		['20261201T215845123Z-3FA9C1', false],
		['20261201T215845123Z-3fa9c', false],
		['20261201T215845123Z-3fa9c1.eml', false],
		['../20261201T215845123Z-3fa9c1', false],
		['20261201T215845123Z-3fa9c1\n', false],
		[' 20261201T215845123Z-3fa9c1', false],
		[null, false],
		[{ id: 'x' }, false]
	])('isMessageId(%j) is %s', (value, expected) => {
		expect(isMessageId(value)).toBe(expected);
	});
});
