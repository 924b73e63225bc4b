/**
 * The demo learners' drill: each gets cards for every lick of the demo teacher's decks, so that
 * `/api/drill/today` has prompts right after `npm run demo`. Idempotent (insert-or-ignore on the
 * unique learner, lick and quality): seeding again adds nothing. Kept apart from the account
 * seed so that simulated practice history can build on it.
 */
import { Deck, DeckLick, Lick, User } from '../db/models/index';
import { insertCards } from '../study/cards';

/** Demo learners and how many cards each got now. */
export async function seedDemoPractice(
	teacherEmail: string,
	learnerEmails: readonly string[],
	now = new Date()
): Promise<{ email: string; created: number }[]> {
	const teacher = await User.findOne({ where: { email: teacherEmail } });
	if (!teacher) return [];
	const decks = await Deck.findAll({ where: { ownerId: teacher.id }, order: [['name', 'ASC']] });
	const links = await DeckLick.findAll({
		where: { deckId: decks.map((d) => d.id) },
		order: [['position', 'ASC']]
	});
	// Deck by deck, in deck order: the first deck's licks come first as new cards.
	const order = decks.flatMap((d) => links.filter((l) => l.deckId === d.id).map((l) => l.lickId));
	const found = await Lick.findAll({ where: { id: order } });
	const licks = [...new Set(order)]
		.map((id) => found.find((l) => l.id === id))
		.filter((l): l is Lick => !!l);
	const out: { email: string; created: number }[] = [];
	for (const email of learnerEmails) {
		const learner = await User.findOne({ where: { email } });
		if (!learner) continue;
		const added = await insertCards(learner.id, licks, [], null, now);
		out.push({ email, created: added.created });
	}
	return out;
}
