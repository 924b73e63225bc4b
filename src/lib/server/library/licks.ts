import { randomBytes } from 'node:crypto';
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import { getDb } from '../db/index';
import { DeckLick, Lick, LickTag, LickVersion, User, VISIBILITIES } from '../db/models/index';
import type { Visibility } from '../db/models/index';
import {
	isInstrumentId,
	isQualityId,
	MAX_ABC_BYTES,
	prepareLick,
	QUALITY_IDS,
	readKeyName,
	VariantRequestError,
	INSTRUMENT_IDS,
	type HandWrittenVersions,
	type QualityId
} from '../../music/index';
import { formatNoteName } from '../../music/pitch';
import { readTempo, setHeaderField } from '../../library/abc-file';
import { readableLick, readableLickSql, type Actor } from './access';
import { LibraryError, lickNotFound } from './errors';
import { lickGrid, type LickVariant } from './grid';
import { getBlobStore } from '../storage/index';

/**
 * The lick library: a person's licks, what their classes share with them and public licks. Every
 * function takes the acting user first and checks access itself (rules in `access.ts`): another
 * author's lick the actor may not see is "not found", for reading and writing alike; one they may
 * see but do not own is refused with 403 when they try to change it.
 */

/** Bounds of a lick's fields, shared by the API, the editor and the importer. */
export const LICK_LIMITS = {
	title: 200,
	note: 20_000,
	tags: 20,
	tag: 40,
	tempoMin: 20,
	tempoMax: 400,
	feelMin: 1,
	feelMax: 4
} as const;

/** A lick in a list. */
export interface LickSummary {
	id: string;
	title: string;
	/** Concert tonic of the home key, e.g. `Eb`. */
	homeKey: string;
	/** Chord quality it is written over (engine id). */
	homeQuality: string;
	tempo: number;
	/** Swing ratio of paired eighths; 1 is straight. */
	feel: number;
	visibility: Visibility;
	tags: string[];
	author: { id: string; name: string };
	/** True when the actor wrote it (and so may change it). */
	mine: boolean;
	hasRecording: boolean;
	updatedAt: string;
}

/** One lick in full. */
export interface LickDetail extends LickSummary {
	abc: string;
	/** Teaching note, Markdown. */
	note: string;
	/** Hand-written versions by quality (abc each). */
	versions: HandWrittenVersions;
	recording: { type: string; size: number } | null;
	/** Slug of the share page `/s/<slug>` while the lick is public; null otherwise. */
	shareSlug: string | null;
	copiedFromId: string | null;
}

/** A lick as the API body describes it; every field optional on update. */
export interface LickInput {
	title?: string;
	abc?: string;
	tags?: string[];
	tempo?: number;
	feel?: number;
	visibility?: Visibility;
	note?: string;
	/** Hand-written versions by quality; on update the whole set is replaced. */
	versions?: HandWrittenVersions;
	/** Overrides of what the abc says about its home. */
	homeKey?: string;
	homeQuality?: QualityId;
}

const FIELDS = [
	'title',
	'abc',
	'tags',
	'tempo',
	'feel',
	'visibility',
	'note',
	'versions',
	'homeKey',
	'homeQuality'
];

const bad = (message: string, field?: string) =>
	new LibraryError(400, message, field ? { field } : {});
const invalid = (message: string, field?: string) =>
	new LibraryError(422, message, field ? { field } : {});

/**
 * A tag as stored: lower case, words joined by hyphens, at most 40 characters.
 * @example normalizeTag('  Chromatic Fill ') // 'chromatic-fill'
 */
export function normalizeTag(tag: string): string {
	return tag.trim().toLowerCase().replace(/\s+/g, '-');
}

/**
 * Check a JSON body's fields and types (the music is checked when it is saved). Throws a
 * `LibraryError` (400 wrong types, 422 values out of bounds) naming the field.
 * @example readLickInput({ title: 'Up', abc: 'X:1\nK:C\n"C7"c' }) // { title: 'Up', abc: … }
 */
export function readLickInput(body: unknown): LickInput {
	if (!body || typeof body !== 'object' || Array.isArray(body)) {
		throw bad('The body must be a JSON object such as {"title": "…", "abc": "X:1\\nK:C\\n…"}.');
	}
	const value = body as Record<string, unknown>;
	const unknown = Object.keys(value).filter((k) => !FIELDS.includes(k));
	if (unknown.length) {
		throw bad(
			`Unknown field ${unknown.map((k) => `“${k}”`).join(', ')}: send ${FIELDS.join(', ')}.`,
			unknown[0]
		);
	}
	const input: LickInput = {};
	const { title, abc, tags, tempo, feel, visibility, note, versions, homeKey, homeQuality } = value;
	if (title !== undefined) {
		if (typeof title !== 'string') throw bad('“title” must be a string.', 'title');
		const t = title.trim();
		if (!t) throw invalid('Give the lick a title.', 'title');
		if (t.length > LICK_LIMITS.title) {
			throw invalid(`A title has at most ${LICK_LIMITS.title} characters.`, 'title');
		}
		input.title = t;
	}
	if (abc !== undefined) {
		if (typeof abc !== 'string') throw bad('“abc” must be a string.', 'abc');
		if (!abc.trim()) throw invalid('Write the lick in abc notation.', 'abc');
		if (Buffer.byteLength(abc, 'utf8') > MAX_ABC_BYTES) {
			throw new LibraryError(413, `A lick's abc is at most ${MAX_ABC_BYTES / 1024} KB.`, {
				field: 'abc'
			});
		}
		input.abc = abc.replace(/\r\n?/g, '\n');
	}
	if (tags !== undefined) {
		if (!Array.isArray(tags) || tags.some((t) => typeof t !== 'string')) {
			throw bad('“tags” must be a list of words, such as ["enclosure", "bebop"].', 'tags');
		}
		const list = [...new Set((tags as string[]).map(normalizeTag).filter(Boolean))];
		if (list.length > LICK_LIMITS.tags) {
			throw invalid(`A lick has at most ${LICK_LIMITS.tags} tags.`, 'tags');
		}
		const long = list.find((t) => t.length > LICK_LIMITS.tag);
		if (long)
			throw invalid(`The tag “${long}” is longer than ${LICK_LIMITS.tag} characters.`, 'tags');
		input.tags = list;
	}
	if (tempo !== undefined) {
		if (typeof tempo !== 'number' || !Number.isInteger(tempo)) {
			throw bad('“tempo” must be a whole number of beats a minute.', 'tempo');
		}
		if (tempo < LICK_LIMITS.tempoMin || tempo > LICK_LIMITS.tempoMax) {
			throw invalid(
				`A tempo lies between ${LICK_LIMITS.tempoMin} and ${LICK_LIMITS.tempoMax} beats a minute.`,
				'tempo'
			);
		}
		input.tempo = tempo;
	}
	if (feel !== undefined) input.feel = readFeel(feel);
	if (visibility !== undefined) {
		if (
			typeof visibility !== 'string' ||
			!(VISIBILITIES as readonly string[]).includes(visibility)
		) {
			throw invalid('“visibility” is one of private, classes or public.', 'visibility');
		}
		input.visibility = visibility as Visibility;
	}
	if (note !== undefined) {
		if (typeof note !== 'string') throw bad('“note” must be a string (Markdown).', 'note');
		if (note.length > LICK_LIMITS.note) {
			throw invalid(`A teaching note has at most ${LICK_LIMITS.note} characters.`, 'note');
		}
		input.note = note.replace(/\r\n?/g, '\n');
	}
	if (versions !== undefined) input.versions = readVersions(versions);
	if (homeKey !== undefined) {
		if (typeof homeKey !== 'string') throw bad('“homeKey” must be a string.', 'homeKey');
		try {
			readKeyName(homeKey);
		} catch (e) {
			if (e instanceof VariantRequestError) throw invalid(e.message, 'homeKey');
			throw e;
		}
		input.homeKey = homeKey;
	}
	if (homeQuality !== undefined) {
		if (typeof homeQuality !== 'string' || !isQualityId(homeQuality)) {
			throw invalid(`“homeQuality” is one of ${QUALITY_IDS.join(', ')}.`, 'homeQuality');
		}
		input.homeQuality = homeQuality;
	}
	return input;
}

/**
 * A feel: `straight`, `swing` (2:1) or a swing ratio from 1 to 4.
 * @example readFeel('straight') // 1
 */
export function readFeel(feel: unknown): number {
	if (feel === 'straight') return 1;
	if (feel === 'swing') return 2;
	if (typeof feel !== 'number' || !Number.isFinite(feel)) {
		throw bad('“feel” is "straight", "swing" or a swing ratio such as 2.', 'feel');
	}
	if (feel < LICK_LIMITS.feelMin || feel > LICK_LIMITS.feelMax) {
		throw invalid('A swing ratio lies between 1 (straight) and 4.', 'feel');
	}
	return feel;
}

function readVersions(input: unknown): HandWrittenVersions {
	if (!input || typeof input !== 'object' || Array.isArray(input)) {
		throw bad(
			'“versions” maps a chord quality to its hand-written abc, such as {"m7": "X:1\\nK:C\\n…"}.',
			'versions'
		);
	}
	const out: HandWrittenVersions = {};
	for (const [quality, text] of Object.entries(input)) {
		if (!isQualityId(quality)) {
			throw invalid(
				`“${quality}” in “versions” is not a chord quality: use one of ${QUALITY_IDS.join(', ')}.`,
				'versions'
			);
		}
		if (text === null || (typeof text === 'string' && !text.trim())) continue;
		if (typeof text !== 'string') {
			throw bad(`The hand-written ${quality} version must be abc text.`, 'versions');
		}
		if (Buffer.byteLength(text, 'utf8') > MAX_ABC_BYTES) {
			throw new LibraryError(413, `A hand-written version is at most ${MAX_ABC_BYTES / 1024} KB.`, {
				field: 'versions'
			});
		}
		out[quality] = text.replace(/\r\n?/g, '\n');
	}
	return out;
}

/** What the music of a lick says about it, once it reads. */
export interface CheckedLick {
	homeKey: string;
	homeQuality: QualityId | null;
}

/**
 * Read a lick's abc and hand-written versions strictly; throws 422 with the engine's line, column
 * and sentence (and the version's quality) for the first error.
 * @example checkLickAbc('X:1\nK:Bb\n"Bb7"B2|') // { homeKey: 'Bb', homeQuality: '7' }
 */
export function checkLickAbc(abc: string, versions: HandWrittenVersions = {}): CheckedLick {
	// One lick, one tune: an empty line ends a tune (abc 2.1 §2.2), so anything after one would
	// silently belong to another tune.
	const lines = abc.replace(/\s+$/, '').split('\n');
	const gap = lines.findIndex((l, i) => l.trim() === '' && i > 0 && i < lines.length - 1);
	if (gap >= 0) {
		throw new LibraryError(
			422,
			'An empty line ends a tune in abc, so a lick has none: remove it. To add several licks at once, import a file.',
			{ line: gap + 1, column: 1, field: 'abc' }
		);
	}
	const prepared = prepareLick(abc, versions);
	if (!prepared.ok) {
		const { message, line, column, version } = prepared.error;
		throw new LibraryError(422, message, {
			field: version ? 'versions' : 'abc',
			...(line !== undefined ? { line } : {}),
			...(column !== undefined ? { column } : {}),
			...(version ? { version } : {})
		});
	}
	const first = prepared.lick.keys[0];
	return {
		homeKey: !first || first.none ? 'C' : formatNoteName(first.tonic),
		homeQuality: prepared.lick.quality
	};
}

type LickRow = Lick & { User?: User; LickTags?: LickTag[]; LickVersions?: LickVersion[] };

function toSummary(actor: Actor | null, row: LickRow, tags: string[]): LickSummary {
	return {
		id: row.id,
		title: row.title,
		homeKey: row.homeKey,
		homeQuality: row.homeQuality,
		tempo: row.tempo,
		feel: row.swingRatio,
		visibility: row.visibility,
		tags,
		author: { id: row.authorId, name: row.User?.name ?? '' },
		mine: actor !== null && row.authorId === actor.id,
		hasRecording: row.recordingKey !== null,
		updatedAt: new Date(row.updatedAt).toISOString()
	};
}

function toDetail(actor: Actor | null, row: LickRow): LickDetail {
	const tags = (row.LickTags ?? []).map((t) => t.tag).sort();
	const versions: HandWrittenVersions = {};
	for (const v of row.LickVersions ?? []) {
		if (isQualityId(v.quality)) versions[v.quality] = v.abc;
	}
	return {
		...toSummary(actor, row, tags),
		abc: row.abc,
		note: row.note,
		versions,
		recording:
			row.recordingKey && row.recordingType
				? { type: row.recordingType, size: row.recordingSize ?? 0 }
				: null,
		shareSlug: row.visibility === 'public' ? row.shareSlug : null,
		copiedFromId: row.copiedFromId
	};
}

const FULL = () => [
	{ model: User, attributes: ['id', 'name'] },
	{ model: LickTag },
	{ model: LickVersion }
];

/** The row of a lick the actor may read, with its author, tags and versions; or 404. */
async function findReadable(actor: Actor, id: string, transaction?: Transaction): Promise<LickRow> {
	if (!isUuid(id)) throw lickNotFound();
	const row = (await Lick.findOne({
		where: { [Op.and]: [{ id }, readableLick(actor)] },
		include: FULL(),
		transaction
	})) as LickRow | null;
	if (!row) throw lickNotFound();
	return row;
}

/** The row of a lick the actor wrote; 404 when they cannot see it, 403 when it is not theirs. */
async function findOwn(actor: Actor, id: string, transaction?: Transaction): Promise<LickRow> {
	const row = await findReadable(actor, id, transaction);
	if (row.authorId !== actor.id) {
		throw new LibraryError(403, 'Only its author can change this lick; copy it to make it yours.');
	}
	return row;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
/** Ids are UUIDs; anything else is "not found" before it reaches PostgreSQL's uuid type. */
export const isUuid = (id: string) => UUID.test(id);

/**
 * One lick in full, if the actor may read it.
 * @example await getLick(user, id) // { id, title, abc, … }
 */
export async function getLick(actor: Actor, id: string): Promise<LickDetail> {
	return toDetail(actor, await findReadable(actor, id));
}

/**
 * May the actor read this lick? For other services (the drill, classes) before they show it.
 * @example await canReadLick(user, id) // true
 */
export async function canReadLick(actor: Actor, id: string): Promise<boolean> {
	if (!isUuid(id)) return false;
	return (await Lick.count({ where: { [Op.and]: [{ id }, readableLick(actor)] } })) > 0;
}

/** Which licks a list shows. */
export type LickScope = 'mine' | 'shared' | 'public' | 'all';
export const LICK_SCOPES: readonly LickScope[] = ['mine', 'shared', 'public', 'all'];
export const LICK_SORTS = [
	'title',
	'-title',
	'updated',
	'-updated',
	'key',
	'quality',
	'tempo',
	'-tempo'
] as const;
export type LickSort = (typeof LICK_SORTS)[number];

export interface LickQuery {
	/** Words found in the title or a tag. */
	q?: string;
	quality?: string;
	key?: string;
	deckId?: string;
	scope?: LickScope;
	sort?: LickSort;
	limit?: number;
	offset?: number;
}

export const MAX_PAGE = 100;

/**
 * A page of the licks the actor may read (their own by default), searched, filtered and sorted.
 * @example await listLicks(user, { q: 'turn', limit: 20 }) // { items: [...], total: 3 }
 */
export async function listLicks(
	actor: Actor,
	query: LickQuery = {}
): Promise<{ items: LickSummary[]; total: number }> {
	const db = getDb();
	const scope = query.scope ?? 'mine';
	// One's own licks are always readable: the access clause (subqueries per row) is skipped.
	const and: WhereOptions[] = scope === 'mine' ? [] : [readableLick(actor)];
	if (scope === 'mine') and.push({ authorId: actor.id });
	else if (scope === 'shared')
		and.push({ authorId: { [Op.ne]: actor.id } }, { visibility: { [Op.ne]: 'public' } });
	else if (scope === 'public') and.push({ visibility: 'public' });
	if (query.quality) and.push({ homeQuality: query.quality });
	if (query.key) and.push({ homeKey: query.key });
	if (query.deckId) {
		if (!isUuid(query.deckId)) return { items: [], total: 0 };
		and.push(
			db.literal(
				`EXISTS (SELECT 1 FROM "deck_licks" AS fdl WHERE fdl."lick_id" = "Lick"."id" AND fdl."deck_id" = ${db.escape(query.deckId)})`
			)
		);
	}
	const q = (query.q ?? '').trim().toLowerCase();
	if (q) {
		// LOWER(…) LIKE works the same on SQLite and PostgreSQL. A % or _ typed by the person
		// becomes "any one character" rather than a wildcard run (no ESCAPE clause, whose
		// backslash quoting differs between the two).
		const pattern = db.escape(`%${q.replace(/[%_]/g, '_')}%`);
		and.push(
			db.literal(
				`(LOWER("Lick"."title") LIKE ${pattern} OR EXISTS (SELECT 1 FROM "lick_tags" AS st WHERE st."lick_id" = "Lick"."id" AND st."tag" LIKE ${pattern}))`
			)
		);
	}
	const sort = query.sort ?? '-updated';
	const column = {
		title: 'title',
		updated: 'updatedAt',
		key: 'homeKey',
		quality: 'homeQuality',
		tempo: 'tempo'
	}[sort.replace(/^-/, '') as 'title'];
	const direction = sort.startsWith('-') ? 'DESC' : 'ASC';
	const limit = Math.min(MAX_PAGE, Math.max(1, query.limit ?? 25));
	const offset = Math.max(0, query.offset ?? 0);
	const where = { [Op.and]: and };
	const [total, rows] = await Promise.all([
		Lick.count({ where }),
		Lick.findAll({
			where,
			include: [{ model: User, attributes: ['id', 'name'] }],
			attributes: { exclude: ['abc', 'note'] },
			order: [
				[column, direction],
				['id', 'ASC']
			],
			limit,
			offset
		}) as Promise<LickRow[]>
	]);
	const tags = await tagsOf(rows.map((r) => r.id));
	return { items: rows.map((r) => toSummary(actor, r, tags.get(r.id) ?? [])), total };
}

/** Tags of many licks in one query, sorted per lick. */
async function tagsOf(ids: string[]): Promise<Map<string, string[]>> {
	const out = new Map<string, string[]>();
	if (!ids.length) return out;
	const rows = await LickTag.findAll({ where: { lickId: ids }, order: [['tag', 'ASC']] });
	for (const row of rows) {
		const list = out.get(row.lickId) ?? [];
		list.push(row.tag);
		out.set(row.lickId, list);
	}
	return out;
}

/** A fresh share slug: 12 characters of base64url, 72 random bits. */
function newShareSlug(): string {
	return randomBytes(9).toString('base64url');
}

/** The abc with its title in `T:` and, when asked, its tempo in `Q:`; one name for each. */
function syncHeader(abc: string, title: string, tempo: number | null): string {
	let out = setHeaderField(abc, 'T', title);
	if (tempo !== null) out = setHeaderField(out, 'Q', `1/4=${tempo}`);
	return out;
}

function homeOf(
	checked: CheckedLick,
	input: LickInput
): { homeKey: string; homeQuality: QualityId } {
	const homeQuality = input.homeQuality ?? checked.homeQuality;
	if (!homeQuality) {
		throw new LibraryError(
			422,
			'The lick names no chord: put a chord symbol such as "C7" before its first note, so that it can be moved to other chord qualities.',
			{ field: 'abc' }
		);
	}
	return { homeKey: input.homeKey ?? checked.homeKey, homeQuality };
}

/**
 * Save a new lick for the actor. Invalid abc is refused with its position and nothing is stored.
 * @example await createLick(user, { title: 'Up', abc: 'X:1\nK:C\n"C7"CEGB|' }) // { id, … }
 */
export async function createLick(
	actor: Actor,
	input: LickInput,
	options: { copiedFromId?: string; transaction?: Transaction } = {}
): Promise<LickDetail> {
	const db = getDb();
	if (input.abc === undefined) throw invalid('Write the lick in abc notation.', 'abc');
	const title = input.title ?? readTitle(input.abc);
	if (!title) throw invalid('Give the lick a title (or a T: line in its abc).', 'title');
	const versions = input.versions ?? {};
	// Checked as sent first, so an error's line and column match the text the person wrote.
	const sent = checkLickAbc(input.abc, versions);
	const tempo = input.tempo ?? readTempo(input.abc) ?? 120;
	const abc = syncHeader(input.abc, title, tempo);
	const checked = abc === input.abc ? sent : checkLickAbc(abc, versions);
	const home = homeOf(checked, input);
	const visibility = input.visibility ?? 'private';
	const run = async (transaction: Transaction) => {
		const row = await Lick.create(
			{
				authorId: actor.id,
				title,
				abc,
				...home,
				note: input.note ?? '',
				tempo,
				swingRatio: input.feel ?? 2,
				visibility,
				shareSlug: visibility === 'public' ? newShareSlug() : null,
				copiedFromId: options.copiedFromId ?? null
			},
			{ transaction }
		);
		await writeTagsAndVersions(row.id, input.tags ?? [], versions, transaction);
		return row.id;
	};
	const id = options.transaction ? await run(options.transaction) : await db.transaction(run);
	return toDetail(actor, await findReadable(actor, id, options.transaction));
}

function readTitle(abc: string): string | null {
	const t = /^T:(.*)$/m.exec(abc)?.[1]?.trim();
	return t ? t.slice(0, LICK_LIMITS.title) : null;
}

async function writeTagsAndVersions(
	lickId: string,
	tags: string[] | undefined,
	versions: HandWrittenVersions | undefined,
	transaction: Transaction
): Promise<void> {
	if (tags !== undefined) {
		await LickTag.destroy({ where: { lickId }, transaction });
		if (tags.length)
			await LickTag.bulkCreate(
				tags.map((tag) => ({ lickId, tag })),
				{ transaction }
			);
	}
	if (versions !== undefined) {
		await LickVersion.destroy({ where: { lickId }, transaction });
		const rows = Object.entries(versions).map(([quality, abc]) => ({
			lickId,
			quality,
			abc: abc as string
		}));
		if (rows.length) await LickVersion.bulkCreate(rows, { transaction });
	}
}

/**
 * Change the actor's own lick: the fields given replace the stored ones (tags and versions as a
 * whole). Invalid abc (or version) is refused with its position and nothing changes.
 * @example await updateLick(user, id, { tempo: 160 }) // { …, tempo: 160 }
 */
export async function updateLick(actor: Actor, id: string, input: LickInput): Promise<LickDetail> {
	const db = getDb();
	const row = await findOwn(actor, id);
	const stored = toDetail(actor, row);
	const title = input.title ?? stored.title;
	const versions = input.versions ?? stored.versions;
	const source = input.abc ?? stored.abc;
	if (input.abc !== undefined || input.versions !== undefined) checkLickAbc(source, versions);
	// A new abc brings its own Q: unless a tempo is sent with it.
	const tempo = input.tempo ?? (input.abc !== undefined ? readTempo(source) : null) ?? stored.tempo;
	const abc = syncHeader(source, title, tempo);
	const checked = checkLickAbc(abc, versions);
	const home =
		input.abc !== undefined || input.homeKey || input.homeQuality
			? homeOf(checked, { ...input, homeKey: input.homeKey, homeQuality: input.homeQuality })
			: { homeKey: stored.homeKey, homeQuality: stored.homeQuality };
	const visibility = input.visibility ?? stored.visibility;
	await db.transaction(async (transaction) => {
		await Lick.update(
			{
				title,
				abc,
				...home,
				tempo,
				note: input.note ?? stored.note,
				swingRatio: input.feel ?? stored.feel,
				visibility,
				// The share link is kept across visibility changes, so a lick made public again
				// keeps the address already given out.
				shareSlug: row.shareSlug ?? (visibility === 'public' ? newShareSlug() : null)
			},
			{ where: { id: row.id, authorId: actor.id }, transaction }
		);
		await writeTagsAndVersions(row.id, input.tags, input.versions, transaction);
	});
	return toDetail(actor, await findReadable(actor, id));
}

/**
 * Delete the actor's own lick, its versions, tags, places in decks and reference recording.
 * @example await deleteLick(user, id)
 */
export async function deleteLick(actor: Actor, id: string): Promise<void> {
	const db = getDb();
	const row = await findOwn(actor, id);
	await db.transaction(async (transaction) => {
		await DeckLick.destroy({ where: { lickId: row.id }, transaction });
		await Lick.destroy({ where: { id: row.id, authorId: actor.id }, transaction });
	});
	if (row.recordingKey) await getBlobStore().delete(row.recordingKey);
}

/**
 * A private copy of a lick the actor may read, in their own library (the share page's "copy").
 * The recording stays with the original.
 * @example await copyLick(user, publicId) // { id: <new>, copiedFromId: publicId, … }
 */
export async function copyLick(actor: Actor, id: string): Promise<LickDetail> {
	const source = toDetail(actor, await findReadable(actor, id));
	return createLick(
		actor,
		{
			title: source.title,
			abc: source.abc,
			tags: source.tags,
			tempo: source.tempo,
			feel: source.feel,
			note: source.note,
			versions: source.versions,
			homeKey: source.homeKey,
			homeQuality: isQualityId(source.homeQuality) ? source.homeQuality : undefined,
			visibility: 'private'
		},
		{ copiedFromId: source.id }
	);
}

/**
 * A public lick by its share slug, for anyone (no actor); null when there is none or it is no
 * longer public.
 * @example await findSharedLick('k3Jx9aQw2LbZ') // { title, abc, … } | null
 */
export async function findSharedLick(slug: string): Promise<LickDetail | null> {
	if (!/^[A-Za-z0-9_-]{6,32}$/.test(slug)) return null;
	const row = (await Lick.findOne({
		where: { shareSlug: slug, visibility: 'public' },
		include: FULL()
	})) as LickRow | null;
	return row ? toDetail(null, row) : null;
}

export interface VariantQuery {
	key?: string;
	quality?: string;
	instrument?: string;
}

/**
 * The lick in one key, or all twelve when no key is named, over a quality (its own by default)
 * for an instrument, with the author's hand-written versions in force.
 * @example await lickVariants(user, id, { instrument: 'alto-sax' }) // { variants: [12 items] }
 */
export async function lickVariants(
	actor: Actor | null,
	id: string | LickDetail,
	query: VariantQuery
): Promise<{ variants: LickVariant[] }> {
	const lick = typeof id === 'string' ? await getLick(actor as Actor, id) : id;
	if (query.key !== undefined) {
		try {
			readKeyName(query.key);
		} catch (e) {
			if (e instanceof VariantRequestError) throw invalid(e.message, 'key');
			throw e;
		}
	}
	if (query.quality !== undefined && !isQualityId(query.quality)) {
		throw invalid(
			`“${query.quality}” is not a chord quality: use one of ${QUALITY_IDS.join(', ')}.`,
			'quality'
		);
	}
	if (query.instrument !== undefined && !isInstrumentId(query.instrument)) {
		throw invalid(
			`“${query.instrument}” is not an instrument: use one of ${INSTRUMENT_IDS.join(', ')}.`,
			'instrument'
		);
	}
	const variants = await lickGrid(lick.abc, {
		keys: query.key ? [query.key] : undefined,
		quality: query.quality as QualityId | undefined,
		instrument: query.instrument,
		versions: lick.versions
	});
	return { variants };
}

/** Device kinds the engine recognises, as tags (the trade's names, hyphenated). */
export const DEVICE_TAGS = ['arpeggio', 'chromatic-fill', 'enclosure', 'leap'] as const;

/**
 * Tags the line's own devices suggest, from the engine's analysis in the home key.
 * @example suggestTags(variant) // ['arpeggio', 'enclosure']
 */
export function suggestTags(variant: Pick<LickVariant, 'devices'>): string[] {
	return [...new Set((variant.devices ?? []).map((d) => normalizeTag(d.kind)))].sort();
}

/** Raw SQL for other services: the licks the actor may read (see `access.ts`). */
export { readableLickSql };
