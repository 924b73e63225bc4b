import { afterEach, describe, expect, test, vi } from 'vitest';
import { configureJobs, enqueueJob, jobsSettled } from '../../../src/lib/server/jobs';

afterEach(() => {
	configureJobs();
	vi.restoreAllMocks();
});

describe('the job queue', () => {
	test('runs jobs after the caller has moved on, and reports when all are done', async () => {
		const done: number[] = [];
		for (let i = 0; i < 5; i++) {
			expect(enqueueJob({ name: `job ${i}`, run: async () => void done.push(i) })).toBe(true);
		}
		// Nothing has run yet: enqueueing returned before any job could.
		expect(done.length).toBeLessThanOrEqual(2);
		expect(await jobsSettled()).toBe(true);
		expect(done.sort()).toEqual([0, 1, 2, 3, 4]);
	});

	test('a job that fails is logged and tried again, up to three tries', async () => {
		configureJobs({ retryDelaysMs: [1, 1] });
		const warn = vi.spyOn(console, 'warn').mockImplementation(() => {});
		const error = vi.spyOn(console, 'error').mockImplementation(() => {});
		let tries = 0;
		enqueueJob({
			name: 'flaky mail',
			run: async () => {
				tries += 1;
				if (tries < 3) throw new Error('SMTP said no');
			}
		});
		expect(await jobsSettled()).toBe(true);
		expect(tries).toBe(3);
		expect(warn).toHaveBeenCalledTimes(2);
		expect(String(warn.mock.calls[0][0])).toContain('"flaky mail" failed (try 1 of 3)');
		expect(error).not.toHaveBeenCalled();

		let hopeless = 0;
		enqueueJob({
			name: 'hopeless mail',
			run: async () => {
				hopeless += 1;
				throw new Error('no such host');
			}
		});
		expect(await jobsSettled()).toBe(true);
		expect(hopeless).toBe(3);
		expect(String(error.mock.calls[0][0])).toContain('"hopeless mail" failed 3 times; giving up');
	});

	test('waiting for the queue gives up after its time limit and says how much is left', async () => {
		const error = vi.spyOn(console, 'error').mockImplementation(() => {});
		let finish!: () => void;
		enqueueJob({ name: 'slow', run: () => new Promise<void>((resolve) => (finish = resolve)) });
		expect(await jobsSettled(10)).toBe(false);
		expect(String(error.mock.calls[0][0])).toContain('1 job(s) still unfinished');
		finish();
		expect(await jobsSettled()).toBe(true);
	});
});
