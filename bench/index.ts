/**
 * `npm run bench`: the time to compute the full grid (12 keys × 9 chord qualities) of a four-bar
 * lick of 26 notes, against two yardsticks measured in the same run on the same machine:
 * - a bare loop of tonal `Note.transpose` over the same notes and intervals (108 × 26 calls);
 * - abcjs `strTranspose` for the same 108 variants, parsing once (it can only shift semitones:
 *   no re-mapping, no degrees, chord symbols from a fixed table).
 * Then the grid route, `POST /api/transpose/grid`, called in-process for the same 12 × 9 grid
 * (JSON in, validation, rate limit, bounded render, JSON out), against a bare `Response` of the
 * same size as a floor.
 * Each figure is the median of several timed batches after a warm-up.
 * Then the reset form's answer time for an address with and without an account, and the cost of
 * a rate-limit hit counted in the database (bench/auth.ts).
 * Then the scheduled mails (bench/digest.ts): reminders for 10 000 learners (BENCH_DIGEST_LEARNERS)
 * composed and handed to the local SMTP stand-in, against the bare handover of one ready-made mail.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import abcjs from 'abcjs';
import { Interval, Note } from 'tonal';
import { computeGrid, prepareLick, renderVariant } from '../src/lib/music/engine';
import { MAJOR_KEY_SPELLINGS } from '../src/lib/music/key-data';
import { QUALITY_IDS, type QualityId } from '../src/lib/music/types';
import { POST as gridRoute } from '../src/routes/api/transpose/grid/+server';
import { configureTransposeLimit } from '../src/lib/server/music/transpose-request';
import { configureEngineBudget } from '../src/lib/server/music/render';
import { benchLibrary } from './library';

const LICK = readFileSync(
	fileURLToPath(new URL('../tests/fixtures/licks/bench-four-bars.abc', import.meta.url)),
	'utf8'
);
const QUALITIES: QualityId[] = [...QUALITY_IDS];
const KEYS = MAJOR_KEY_SPELLINGS;

/** Fastest batch per timed figure, for the report below (least disturbed by other processes). */
const fastest = new Map<string, number>();

/** Median milliseconds per call of `fn`, over `batches` batches of `reps` calls. */
function measure(name: string, fn: () => unknown, reps: number, batches = 15): number {
	for (let i = 0; i < reps * 3; i++) fn();
	const times: number[] = [];
	for (let b = 0; b < batches; b++) {
		const t0 = performance.now();
		for (let i = 0; i < reps; i++) fn();
		times.push((performance.now() - t0) / reps);
	}
	times.sort((a, b) => a - b);
	fastest.set(name, times[0]);
	return times[Math.floor(times.length / 2)];
}

/** Like `measure`, for work that awaits. */
async function measureAsync(
	name: string,
	fn: () => Promise<unknown>,
	reps: number,
	batches = 9
): Promise<number> {
	for (let i = 0; i < reps * 2; i++) await fn();
	const times: number[] = [];
	for (let b = 0; b < batches; b++) {
		const t0 = performance.now();
		for (let i = 0; i < reps; i++) await fn();
		times.push((performance.now() - t0) / reps);
	}
	times.sort((a, b) => a - b);
	fastest.set(name, times[0]);
	return times[Math.floor(times.length / 2)];
}

const prepared = prepareLick(LICK);
if (!prepared.ok) throw new Error(`The benchmark lick does not parse: ${prepared.error.message}`);
const { tune } = prepared.lick;
const pitches = tune.notes.map((n) => n.pitch);
const home = 'F';
const intervals = KEYS.map((k) => Interval.distance(home, k));

let sink = 0;

// 1. Our grid: parse once, re-map over 9 qualities, transpose to 12 keys, spell, emit abc, label
// every note with its degree.
const gridMs = measure(
	'grid',
	() => {
		const grid = computeGrid(LICK, KEYS, QUALITIES);
		if (!grid.ok) throw new Error(grid.error.message);
		sink += grid.variants.length;
	},
	20
);

// The same without the parse and the re-mapping (they are cached on a prepared lick).
const renderMs = measure(
	'render',
	() => {
		for (const to of KEYS)
			for (const quality of QUALITIES)
				sink += renderVariant(prepared.lick, { to, quality }).abc.length;
	},
	20
);

// 2. A bare tonal loop over the same notes and intervals: 108 variants × 26 notes.
const tonalMs = measure(
	'tonal',
	() => {
		for (const iv of intervals) {
			for (let q = 0; q < QUALITIES.length; q++) {
				for (const p of pitches) sink += Note.transpose(p, iv).length;
			}
		}
	},
	20
);

// 3. abcjs: parse once, then strTranspose for each of the 108 variants.
const visual = abcjs.parseOnly(LICK);
const semitones = KEYS.map((k) => {
	const s = Interval.semitones(Interval.distance(home, k)) ?? 0;
	return s > 6 ? s - 12 : s;
});
const abcjsMs = measure(
	'abcjs',
	() => {
		for (const s of semitones) {
			for (let q = 0; q < QUALITIES.length; q++) sink += abcjs.strTranspose(LICK, visual, s).length;
		}
	},
	5
);

// 4. The grid route in-process: a Request with the JSON body, the handler, the JSON answer read.
configureTransposeLimit({ max: 1e9, windowMs: 60_000 });
configureEngineBudget(1e9);
type GridEvent = Parameters<typeof gridRoute>[0];
const gridBody = JSON.stringify({ abc: LICK, keys: KEYS, qualities: QUALITIES });
let answerBytes = 0;
const routeMs = await measureAsync(
	'route',
	async () => {
		const request = new Request('http://localhost/api/transpose/grid', {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: gridBody
		});
		const event = { request, getClientAddress: () => '127.0.0.1' } as unknown as GridEvent;
		const response = await gridRoute(event);
		if (response.status !== 200) throw new Error(`grid route answered ${response.status}`);
		answerBytes = (await response.text()).length;
	},
	10
);
// The floor: the same bytes through a bare Response, no engine.
const sample = 'x'.repeat(answerBytes);
const floorMs = await measureAsync(
	'floor',
	async () => {
		sink += (await new Response(sample).text()).length;
	},
	10
);

const variants = KEYS.length * QUALITIES.length;
const us = (ms: number) => `${(ms * 1000).toFixed(1)} µs`;
const lines = [
	`Lick: ${tune.notes.length} notes, four bars; grid of ${KEYS.length} keys × ${QUALITIES.length} qualities = ${variants} variants`,
	'',
	`Twelvefold grid (parse + re-map + transpose + emit + degrees): ${gridMs.toFixed(3)} ms  (${us(gridMs / variants)} a variant)`,
	`  of which rendering the ${variants} variants of a prepared lick:      ${renderMs.toFixed(3)} ms  (${us(renderMs / variants)} a variant)`,
	`tonal Note.transpose loop (${variants} × ${pitches.length} calls):              ${tonalMs.toFixed(3)} ms`,
	`abcjs strTranspose, ${variants} variants, parsed once:                ${abcjsMs.toFixed(3)} ms  (${us(abcjsMs / variants)} a variant)`,
	'',
	`Ratio grid / tonal loop:  ${(gridMs / tonalMs).toFixed(2)}×   (aim < 1×)`,
	`Ratio grid / abcjs:       ${(gridMs / abcjsMs).toFixed(2)}×   (aim < 1×, per variant)`,
	`Grid under 2 ms:          ${gridMs < 2 ? 'yes' : 'no'}`,
	`Grid under the tonal loop: ${gridMs < tonalMs ? 'yes' : 'no'}`,
	'',
	`POST /api/transpose/grid, ${KEYS.length} keys × ${QUALITIES.length} qualities, in-process: ${routeMs.toFixed(3)} ms  (answer ${(answerBytes / 1024).toFixed(0)} KB)`,
	`  floor, a bare Response of the same ${(answerBytes / 1024).toFixed(0)} KB:                 ${floorMs.toFixed(3)} ms`,
	`  Ratio route / floor:     ${(routeMs / floorMs).toFixed(2)}×;  route / grid: ${(routeMs / gridMs).toFixed(2)}×`,
	`  fastest batches: route ${fastest.get('route')?.toFixed(3)} ms, floor ${fastest.get('floor')?.toFixed(3)} ms`,
	`Fastest batches: grid ${fastest.get('grid')?.toFixed(3)} ms, tonal ${fastest.get('tonal')?.toFixed(3)} ms, abcjs ${fastest.get('abcjs')?.toFixed(3)} ms (figures above are medians)`,
	'',
	// Shared machines make timings noisy; the load shows how noisy this run was.
	`Machine: ${cpus().length} cores, load average ${loadavg()
		.map((l) => l.toFixed(2))
		.join(' ')}; Node ${process.version}`
];
console.log(lines.join('\n'));
if (sink === 0) console.log('(nothing computed)');

console.log('');
console.log((await benchLibrary()).join('\n'));
// The drill's figures: today's queue over 5,000 cards, and review writes under load.
await import('./drill');
// Class progress and the heat map over a large review log (bench/classes.ts).
const { benchClasses } = await import('./classes');
console.log(['', ...(await benchClasses())].join('\n'));
// The account edge: the reset form's answer time with and without an account, and a rate-limit
// hit in the database against one in memory (bench/auth.ts).
const { benchAuth } = await import('./auth');
console.log((await benchAuth()).join('\n'));
// The scheduled mails, in a process of their own so that the peak memory is theirs alone.
const digestRun = spawnSync(process.execPath, ['--import', 'tsx', 'bench/digest.ts'], {
	encoding: 'utf8',
	env: process.env,
	maxBuffer: 16 * 1024 * 1024
});
const digestLine = digestRun.stdout.trim().split('\n').at(-1) ?? '';
if (digestRun.status !== 0 || !digestLine.startsWith('{')) {
	console.log(`\nScheduled mails: the benchmark failed\n${digestRun.stderr}`);
	process.exitCode = 1;
} else {
	const d = JSON.parse(digestLine) as {
		learners: number;
		sent: number;
		failed: number;
		digestMs: number;
		handoverMs: number;
		rssBeforeMb: number;
		digestPeakMb: number;
		handoverPeakMb: number;
	};
	const perSecond = (n: number, ms: number) => (n / (ms / 1000)).toFixed(1);
	console.log(
		[
			'',
			`Daily reminders for ${d.learners} learners (3 due, 2 new, a week of history each), local SMTP stand-in, pooled transport:`,
			`  compose + claim + hand over: ${(d.digestMs / 1000).toFixed(1)} s, ${d.sent} sent, ${d.failed} failed: ${perSecond(d.sent, d.digestMs)} mails/s`,
			`  peak memory (RSS) during the run: ${d.digestPeakMb.toFixed(0)} MB (${d.rssBeforeMb.toFixed(0)} MB before it)`,
			`  yardstick, one ready-made mail ${d.learners} times through the same pool: ${(d.handoverMs / 1000).toFixed(1)} s, ${perSecond(d.learners, d.handoverMs)} mails/s, peak ${d.handoverPeakMb.toFixed(0)} MB`,
			`  Ratio reminders / ready-made handover: ${(d.digestMs / d.handoverMs).toFixed(2)}×`
		].join('\n')
	);
}
