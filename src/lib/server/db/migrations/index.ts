import type { Migration } from './types';
import { accounts } from './0001-accounts';
import { coreLoop } from './0002-core-loop';
import { settingsColumns } from './0003-settings-columns';
import { checkConstraints } from './0003-check-constraints';
import { mailChoices } from './0040-mail-choices';
import { rateLimitCounters } from './0041-rate-limit-counters';

export type { Migration } from './types';

/**
 * Every migration, in order. An explicit list rather than a glob so that the Vite build, vitest
 * and tsx scripts all run the same set. Add new ones at the end; never reorder or rename.
 */
export const migrations: Migration[] = [
	accounts,
	coreLoop,
	settingsColumns,
	checkConstraints,
	mailChoices,
	rateLimitCounters
];
