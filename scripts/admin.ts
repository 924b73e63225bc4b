// `npm run admin -- promote EMAIL`: give an existing account the admin role.
import { makeAdmin } from '../src/lib/server/auth/user';
import { closeDb, getDb } from '../src/lib/server/db/index';
import { migrate } from '../src/lib/server/db/migrate';

const [command, email] = process.argv.slice(2);
if (command !== 'promote' || !email) {
	console.error('Usage: npm run admin -- promote EMAIL');
	process.exit(2);
}
await migrate(getDb());
const result = await makeAdmin(email);
await closeDb();
if (!result.ok) {
	console.error(result.message);
	process.exit(1);
}
console.log(
	result.changed
		? `${result.user.email} is now an admin.`
		: `${result.user.email} was already an admin.`
);
