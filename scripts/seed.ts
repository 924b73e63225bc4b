// `npm run seed`: create the demo scenario's accounts (idempotent). Password: DEMO_PASSWORD.
import { closeDb, getDb } from '../src/lib/server/db/index';
import { migrate } from '../src/lib/server/db/migrate';
import { seedDemo, DEMO_ACCOUNTS } from '../src/lib/server/demo/seed';

const password = process.env.DEMO_PASSWORD || 'demo-password-12';
await migrate(getDb());
let report;
try {
	report = await seedDemo(password);
} catch (error) {
	// A weak DEMO_PASSWORD: say why in one line, not as a stack.
	await closeDb();
	console.error(error instanceof Error ? error.message : String(error));
	process.exit(1);
}
await closeDb();
console.log(
	report.created.length
		? `Seeded ${report.created.join(', ')}`
		: `Demo data already present (${DEMO_ACCOUNTS.length} accounts kept).`
);
