import type { QueryInterface } from 'sequelize';

/** One schema change. `up` must work on SQLite and PostgreSQL alike (no dialect-only SQL). */
export interface Migration {
	/** Stored in `schema_migrations` once applied; never rename an applied migration. */
	name: string;
	up(context: { context: QueryInterface }): Promise<void>;
	down(context: { context: QueryInterface }): Promise<void>;
	/**
	 * True when the migration opens its own transaction (a SQLite table rebuild must switch
	 * foreign keys off first, which a PRAGMA cannot do inside one). Every other migration runs in
	 * a transaction the runner opens, and its QueryInterface calls join it by themselves.
	 */
	ownTransaction?: boolean;
}
