import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/auth/guard';
import { LibraryError } from '$lib/server/library/errors';
import { getLick, lickVariants } from '$lib/server/library/licks';
import { isInstrumentId, isQualityId } from '$lib/music';
import type { PageServerLoad } from './$types';

/** The twelve-key sheet: one lick in every key for an instrument and quality, for the stand. */
export const load: PageServerLoad = async ({ params, url }) => {
	const user = requireUser();
	const asked = url.searchParams.get('instrument');
	const instrument =
		asked && isInstrumentId(asked) ? asked : (user.settings.instrument ?? 'concert');
	const q = url.searchParams.get('quality');
	const paper = url.searchParams.get('paper') === 'letter' ? 'letter' : 'a4';
	try {
		const lick = await getLick(user, params.id);
		const quality = q && isQualityId(q) ? q : lick.homeQuality;
		const { variants } = await lickVariants(user, lick, { instrument, quality });
		return {
			lick: {
				id: lick.id,
				title: lick.title,
				tempo: lick.tempo,
				feel: lick.feel,
				homeQuality: lick.homeQuality
			},
			instrument,
			quality,
			paper,
			variants: variants.map((v) => ({
				key: v.key,
				writtenKey: v.writtenKey,
				abc: v.abc,
				handWritten: v.handWritten,
				warning: v.warnings[0]?.message ?? null
			}))
		};
	} catch (e) {
		if (e instanceof LibraryError) error(e.status, e.message);
		throw e;
	}
};
