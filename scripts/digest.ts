// `npm run digest`: send the scheduled mails that are due now, as the server's own job does
// every few minutes. `--now ISO` acts at another instant; `--dry-run` prints the mails instead
// of claiming and sending them; `--kind digest|summary` looks at one kind only.
import { parseArgs } from 'node:util';
import { closeDb, getDb } from '../src/lib/server/db/index';
import { migrate } from '../src/lib/server/db/migrate';
import { stopMail } from '../src/lib/server/mail/index';
import { runScheduledMail } from '../src/lib/server/digest/send';

const usage =
	'Usage: npm run digest -- [--now 2026-03-02T08:00:00Z] [--dry-run] [--kind digest|summary]';
let values: { now?: string; 'dry-run'?: boolean; kind?: string; help?: boolean };
try {
	({ values } = parseArgs({
		options: {
			now: { type: 'string' },
			'dry-run': { type: 'boolean' },
			kind: { type: 'string' },
			help: { type: 'boolean', short: 'h' }
		}
	}));
} catch (error) {
	console.error(`${(error as Error).message}\n${usage}`);
	process.exit(2);
}
if (values.help) {
	console.log(usage);
	process.exit(0);
}
const now = values.now ? new Date(values.now) : new Date();
if (Number.isNaN(now.getTime())) {
	console.error(
		`--now ${JSON.stringify(values.now)} is not a date and time; write it as 2026-03-02T08:00:00Z.\n${usage}`
	);
	process.exit(2);
}
if (values.kind && values.kind !== 'digest' && values.kind !== 'summary') {
	console.error(`--kind ${JSON.stringify(values.kind)} is neither digest nor summary.\n${usage}`);
	process.exit(2);
}
const kinds = values.kind ? [values.kind as 'digest' | 'summary'] : undefined;

await migrate(getDb());
try {
	const report = await runScheduledMail({ now, dryRun: values['dry-run'], kinds });
	for (const mail of report.previews) {
		console.log(
			`--- ${mail.kind} to ${mail.to} for ${mail.day}\nSubject: ${mail.subject}\n\n${mail.text}`
		);
	}
	const summary = values['dry-run']
		? `Dry run at ${now.toISOString()}: ${report.previews.length} mail(s) would go out, ${report.skipped} person(s) have nothing to read.`
		: `At ${now.toISOString()}: ${report.sent} sent, ${report.skipped} with nothing to read, ${report.failed} failed, ${report.taken} already taken by another process, ${report.retried} retried.`;
	console.log(summary);
	if (report.failed > 0) process.exitCode = 1;
} finally {
	await stopMail();
	await closeDb();
}
