import { isInstrumentId } from '$lib/music/instruments';
import type { PageServerLoad } from './$types';

// A signed-in visitor's try-it box starts on the instrument from their settings.
export const load: PageServerLoad = ({ locals }) => {
	const own = locals.user?.settings.instrument;
	return { instrument: own && isInstrumentId(own) ? own : 'concert' };
};
