import type { QueryInterface } from 'sequelize';

/** One schema change. `up` must work on SQLite and PostgreSQL alike (no dialect-only SQL). */
export interface Migration {
	/** Stored in `schema_migrations` once applied; never rename an applied migration. */
	name: string;
	up(context: { context: QueryInterface }): Promise<void>;
	down(context: { context: QueryInterface }): Promise<void>;
}
