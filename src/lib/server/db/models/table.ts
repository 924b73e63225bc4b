import { DataTypes, type Model, type ModelStatic, type Sequelize } from 'sequelize';

/**
 * How every table of ours is bound to its model: snake_case columns, a primary key of one of three
 * kinds, and the time stamps Sequelize fills in. Each model then states only its own columns; the
 * tables themselves are made by the migrations, never from these definitions.
 */

/** The columns `Model.init` expects for a model: every attribute but its foreign keys. */
type Columns<MS extends ModelStatic<Model>> = Parameters<
	typeof Model.init<MS, InstanceType<MS>>
>[0];

/** Which time stamps a table keeps: both, only the creation (rows never change), or none. */
export type Stamps = 'created-updated' | 'created' | 'none';

/** A random UUID made on insert: rows whose id travels in URLs. */
export const uuidKey = () => ({
	type: DataTypes.UUID,
	primaryKey: true,
	defaultValue: DataTypes.UUIDV4
});

/** A counter the database assigns: link rows no URL names. */
export const serialKey = () => ({
	type: DataTypes.INTEGER,
	primaryKey: true,
	autoIncrement: true
});

/** A 64-character key the caller supplies (the SHA-256 hex of a token). */
export const hashKey = () => ({ type: DataTypes.STRING(64), primaryKey: true });

/**
 * Bind `model` to `tableName` with its columns and the stamps the table keeps.
 * @example bindTable(Deck, sequelize, 'decks', 'created-updated', { id: uuidKey(), name: … })
 */
export function bindTable<MS extends ModelStatic<Model>>(
	model: MS,
	sequelize: Sequelize,
	tableName: string,
	stamps: Stamps,
	columns: Omit<Columns<MS>, 'createdAt' | 'updatedAt'>
): void {
	const stampColumns = {
		'created-updated': { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE },
		created: { createdAt: DataTypes.DATE },
		none: {}
	}[stamps];
	const stampOptions = {
		'created-updated': {},
		created: { updatedAt: false },
		none: { timestamps: false }
	}[stamps];
	model.init({ ...columns, ...stampColumns } as Columns<MS>, {
		sequelize,
		tableName,
		underscored: true,
		...stampOptions
	});
}
