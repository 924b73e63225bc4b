// The yardstick for `POST /api/drill/reviews`: the same write in a bare node:http handler over
// sqlite3, with none of the app's layers (no session look-up, no validation beyond parsing, no
// scheduling): read the card, insert the review, compare-and-set the card, in one IMMEDIATE
// transaction, with the app's pragmas. Started by bench/drill.ts with DB_FILE and PORT.
import http from 'node:http';
import { randomUUID } from 'node:crypto';
import sqlite3 from 'sqlite3';

const db = new sqlite3.Database(process.env.DB_FILE);
db.configure('busyTimeout', 5000);
const run = (sql, params = []) =>
	new Promise((resolve, reject) =>
		db.run(sql, params, function (err) {
			if (err) reject(err);
			else resolve(this);
		})
	);
const get = (sql, params = []) =>
	new Promise((resolve, reject) =>
		db.get(sql, params, (err, row) => (err ? reject(err) : resolve(row)))
	);
await run('PRAGMA journal_mode=WAL');
await run('PRAGMA synchronous=NORMAL');
await run('PRAGMA foreign_keys=ON');

// One transaction at a time, as the app's serialised transactions do.
let tail = Promise.resolve();
const serial = (fn) => {
	const next = tail.then(fn, fn);
	tail = next.catch(() => {});
	return next;
};

const server = http.createServer((req, res) => {
	let body = '';
	req.on('data', (c) => (body += c));
	req.on('end', async () => {
		try {
			const input = JSON.parse(body);
			const userId = req.headers['x-user'];
			const result = await serial(async () => {
				await run('BEGIN IMMEDIATE');
				try {
					const card = await get('SELECT * FROM cards WHERE id = ? AND user_id = ?', [
						input.cardId,
						userId
					]);
					if (!card) throw Object.assign(new Error('no card'), { status: 404 });
					const now = new Date().toISOString();
					const id = randomUUID();
					await run(
						`INSERT INTO reviews (id, card_id, user_id, lick_id, client_id, reviewed_at, day, grade, key, quality,
						 state_before, state_after, created_at) VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?)`,
						[
							id,
							card.id,
							userId,
							card.lick_id,
							input.clientId,
							now,
							now.slice(0, 10),
							input.grade,
							input.key,
							input.quality,
							JSON.stringify(card),
							JSON.stringify(card),
							now
						]
					);
					const changed = await run(
						'UPDATE cards SET reps = reps + 1, version = version + 1, updated_at = ? WHERE id = ? AND version = ?',
						[now, card.id, card.version]
					);
					if (changed.changes !== 1) throw Object.assign(new Error('conflict'), { status: 409 });
					await run('COMMIT');
					return { review: { id }, card: { id: card.id, version: card.version + 1 } };
				} catch (e) {
					await run('ROLLBACK');
					throw e;
				}
			});
			res.writeHead(201, { 'content-type': 'application/json' });
			res.end(JSON.stringify(result));
		} catch (e) {
			res.writeHead(e.status ?? 400, { 'content-type': 'application/json' });
			res.end(JSON.stringify({ error: { message: String(e.message) } }));
		}
	});
});
server.listen(Number(process.env.PORT), '127.0.0.1', () => process.send?.('ready'));
