import { INSTRUMENT_ROWS } from '$lib/music/instruments-data';
import { requireRole } from '$lib/server/auth/guard';
import type { PageServerLoad } from './$types';

// The sitting itself loads in the browser (from /api/drill/today, or from the device when the
// network is gone); the page only needs who is drilling and what they read.
export const load: PageServerLoad = () => {
	const user = requireRole('learner', 'teacher', 'admin');
	const row = INSTRUMENT_ROWS.find((r) => r.id === user.settings.instrument) ?? INSTRUMENT_ROWS[0];
	return {
		userId: user.id,
		instrument: {
			id: row.id as string,
			label: row.label,
			tablature: row.tablature === 'guitar'
		}
	};
};
