import path from 'node:path';

/** Fixed port of the built server under test, away from the demo's 3000 and vite's 5173. */
export const E2E_PORT = Number(process.env.E2E_PORT || 4173);
export const E2E_ORIGIN = `http://localhost:${E2E_PORT}`;
/** A fresh data folder for each run: SQLite file and mail outbox. Wiped by `serve.mjs`. */
export const E2E_DATA_DIR = path.resolve(process.env.E2E_DATA_DIR || 'tmp/e2e-data');
