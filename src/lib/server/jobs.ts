/**
 * A small in-process queue for work done after the answer has gone out, so that how long a
 * request takes does not tell what the work found (a reset mail for a known address, nothing for
 * an unknown one). Jobs run two at a time in the order they came; one that throws is logged and
 * tried again after a wait, up to three tries in all.
 *
 * Jobs live in this process's memory: a job queued just before a crash is lost. Use it only for
 * work a person can make good by asking again (a reset link that never came), never for work
 * that must happen exactly once (that belongs in a table, like the scheduled mails' claims).
 */

export interface Job {
	/** What the log calls it; never a secret or an address. */
	name: string;
	run: () => Promise<void>;
}

const CONCURRENCY = 2;
/** Beyond this many waiting jobs new ones are dropped (and logged) rather than held in memory. */
const MAX_WAITING = 1000;
const DEFAULT_RETRY_DELAYS_MS = [2_000, 30_000];

let retryDelaysMs = DEFAULT_RETRY_DELAYS_MS;
const waiting: { job: Job; attempt: number }[] = [];
let running = 0;
/** Jobs waiting for a retry's timer. */
let retrying = 0;
let settledWaiters: (() => void)[] = [];

/** Tests shorten the waits between tries; with no argument, the defaults again. */
export function configureJobs(options: { retryDelaysMs?: number[] } = {}): void {
	retryDelaysMs = options.retryDelaysMs ?? DEFAULT_RETRY_DELAYS_MS;
}

/**
 * Queue a job; false when the queue is full and the job was dropped.
 * @example enqueueJob({ name: 'password reset mail', run: () => mailResetLink(email) })
 */
export function enqueueJob(job: Job): boolean {
	if (waiting.length >= MAX_WAITING) {
		console.error(`[jobs] queue full (${MAX_WAITING} waiting): dropped "${job.name}"`);
		return false;
	}
	waiting.push({ job, attempt: 1 });
	pump();
	return true;
}

function pump(): void {
	while (running < CONCURRENCY && waiting.length > 0) {
		const next = waiting.shift()!;
		running += 1;
		void runOne(next.job, next.attempt).finally(() => {
			running -= 1;
			pump();
			notifyIfSettled();
		});
	}
}

async function runOne(job: Job, attempt: number): Promise<void> {
	try {
		await job.run();
	} catch (error) {
		const tries = retryDelaysMs.length + 1;
		if (attempt >= tries) {
			console.error(`[jobs] "${job.name}" failed ${tries} times; giving up:`, error);
			return;
		}
		const delay = retryDelaysMs[attempt - 1];
		console.warn(
			`[jobs] "${job.name}" failed (try ${attempt} of ${tries}); again in ${delay} ms:`,
			error
		);
		retrying += 1;
		const timer = setTimeout(() => {
			retrying -= 1;
			waiting.push({ job, attempt: attempt + 1 });
			pump();
			notifyIfSettled();
		}, delay);
		// A retry alone does not keep a finished process alive; `jobsSettled` waits for it.
		timer.unref();
	}
}

function isSettled(): boolean {
	return running === 0 && retrying === 0 && waiting.length === 0;
}

function notifyIfSettled(): void {
	if (!isSettled()) return;
	const waiters = settledWaiters;
	settledWaiters = [];
	for (const resolve of waiters) resolve();
}

/**
 * Resolves once every queued job has finished (retries included), or after `timeoutMs`,
 * whichever comes first; true when everything finished. Tests wait on it before reading the
 * outbox; the server waits on it (bounded) when it shuts down.
 */
export function jobsSettled(timeoutMs = 60_000): Promise<boolean> {
	if (isSettled()) return Promise.resolve(true);
	return new Promise((resolve) => {
		const timer = setTimeout(() => {
			settledWaiters = settledWaiters.filter((w) => w !== done);
			console.error(
				`[jobs] ${running + retrying + waiting.length} job(s) still unfinished after ${timeoutMs} ms`
			);
			resolve(false);
		}, timeoutMs);
		timer.unref();
		const done = () => {
			clearTimeout(timer);
			resolve(true);
		};
		settledWaiters.push(done);
	});
}
