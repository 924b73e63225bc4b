import { requireRole } from '$lib/server/auth/guard';
import { listDecks } from '$lib/server/library/decks';
import { listLicks } from '$lib/server/library/licks';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireRole('teacher', 'admin');
	const [licks, decks] = await Promise.all([
		listLicks(user, { limit: 1 }),
		listDecks(user, { limit: 5 })
	]);
	return {
		firstName: user.name.trim().split(/\s+/)[0] || user.name,
		lickCount: licks.total,
		decks: {
			total: decks.total,
			items: decks.items.map((d) => ({ id: d.id, name: d.name, lickCount: d.lickCount }))
		}
	};
};
