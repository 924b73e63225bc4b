import { DEMO_LICKS } from '../../demo/licks';
import { Lick } from '../db/models/index';
import type { Actor } from './access';
import { createLick } from './licks';

/**
 * Our demo licks, copied into the actor's library (private), skipping any title already there.
 * Answers how many were added.
 * @example await addDemoLicks(user) // 8
 */
export async function addDemoLicks(actor: Actor): Promise<number> {
	let made = 0;
	for (const demo of DEMO_LICKS) {
		if (await Lick.count({ where: { authorId: actor.id, title: demo.title } })) continue;
		await createLick(actor, {
			title: demo.title,
			abc: demo.abc,
			note: demo.note,
			tags: demo.devices
		});
		made += 1;
	}
	return made;
}
