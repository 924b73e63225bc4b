import { Cron } from 'croner';
import { getConfig } from '../config';
import { runScheduledMail, type RunReport } from './send';

/**
 * The job that sends the scheduled mails from inside the server process: every few minutes
 * (`DIGEST_SCHEDULE`, default every five) one run of `runScheduledMail`. A run never overlaps
 * the previous one (`protect`), never throws into the server (errors are logged), and holds no
 * request: it works through the database and a pooled SMTP transport of its own, between
 * requests, so a slow mail service delays only the mails. Several processes may run it at once;
 * the `mail_sends` claims keep every mail single.
 */

let job: Cron | null = null;
let current: Promise<RunReport | null> | null = null;

function describe(report: RunReport): string {
	return `${report.sent} sent, ${report.skipped} with nothing to read, ${report.failed} failed, ${report.retried} retried`;
}

/**
 * Start the job (once; later calls do nothing). `DIGEST_SCHEDULE=off` leaves it stopped.
 * @example startDigestScheduler() // true when a job now runs
 */
export function startDigestScheduler(): boolean {
	const pattern = getConfig().digestSchedule;
	if (job || !pattern) return false;
	job = new Cron(pattern, { name: 'scheduled-mail', protect: true, unref: true }, async () => {
		current = runScheduledMail().then(
			(report) => {
				if (report.sent + report.failed + report.retried > 0) {
					console.log(`[digest] ${describe(report)}`);
				}
				return report;
			},
			(error: unknown) => {
				console.error('[digest] the scheduled mail run failed:', error);
				return null;
			}
		);
		await current;
	});
	return true;
}

/** Stop the job and wait for a run in progress to finish (a clean shutdown, tests). */
export async function stopDigestScheduler(): Promise<void> {
	job?.stop();
	job = null;
	await current;
	current = null;
}
