import { Readable } from 'node:stream';
import { json } from '@sveltejs/kit';
import { stringify } from 'csv-stringify';
import { refusal, signInFirst } from '$lib/server/classes/http';
import {
	classProgress,
	PROGRESS_CSV_COLUMNS,
	progressCsvRecord
} from '$lib/server/classes/progress';
import { apiError } from '$lib/server/http/json';
import type { RequestHandler } from './$types';

/**
 * `GET /api/classes/[id]/progress` (its teacher) `?assignment=&sort=&dir=asc|desc` → `{items,
 * total, sort, dir, assignmentId}`, one row a learner; `&format=csv` streams the same rows as CSV.
 */
export const GET: RequestHandler = async ({ locals, params, url }) => {
	if (!locals.user) return signInFirst(null)!;
	const format = url.searchParams.get('format') ?? 'json';
	if (format !== 'json' && format !== 'csv') {
		return apiError(400, 'Ask for format=json or format=csv.', { field: 'format' });
	}
	const result = await classProgress(locals.user, params.id, {
		assignmentId: url.searchParams.get('assignment') ?? undefined,
		sort: url.searchParams.get('sort') ?? undefined,
		dir: url.searchParams.get('dir') ?? undefined
	});
	if (!result.ok) return refusal(result);
	if (format === 'json') {
		const { items, total, sort, dir, assignmentId } = result;
		return json({ items, total, sort, dir, assignmentId });
	}
	const csv = stringify({ header: true, columns: PROGRESS_CSV_COLUMNS.map((c) => c.header) });
	// Rows go into the stringifier as the response is read, so a large class never sits in
	// memory as one string.
	Readable.from(result.items.map(progressCsvRecord)).pipe(csv);
	return new Response(Readable.toWeb(csv) as ReadableStream, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="class-progress-${params.id.slice(0, 8)}.csv"`
		}
	});
};
