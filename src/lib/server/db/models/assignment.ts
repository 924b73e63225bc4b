import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { bindTable, uuidKey } from './table';
import type { ClassGroup } from './class';
import type { Deck } from './deck';

/** A deck assigned to a class at a pace: new cards arrive `newPerDay` at a time from `startDate`. */
export class Assignment extends Model<
	InferAttributes<Assignment>,
	InferCreationAttributes<Assignment>
> {
	declare id: CreationOptional<string>;
	declare classId: ForeignKey<ClassGroup['id']>;
	declare deckId: ForeignKey<Deck['id']>;
	/** Local days, YYYY-MM-DD. */
	declare startDate: string;
	declare endDate: CreationOptional<string | null>;
	declare newPerDay: number;
	/** Key tonics to drill; null means all twelve. Stored as JSON text. */
	declare keys: CreationOptional<string[] | null>;
	/** Qualities drilled besides each lick's home one. Stored as JSON text. */
	declare qualities: CreationOptional<string[]>;
	declare targetTempo: CreationOptional<number | null>;
	declare pausedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

/** A JSON text column read and written as a value (portable: TEXT on every dialect). */
function jsonText(name: 'keys' | 'qualities', fallback: string[] | null) {
	return {
		get(this: Assignment) {
			const raw = this.getDataValue(name) as unknown;
			if (raw === null || raw === undefined) return fallback;
			try {
				return typeof raw === 'string' ? JSON.parse(raw) : raw;
			} catch {
				return fallback;
			}
		},
		set(this: Assignment, value: string[] | null) {
			this.setDataValue(name, (value === null ? null : JSON.stringify(value)) as never);
		}
	};
}

export function initAssignment(sequelize: Sequelize): void {
	bindTable(Assignment, sequelize, 'assignments', 'created-updated', {
		id: uuidKey(),
		startDate: { type: DataTypes.STRING(10), allowNull: false },
		endDate: { type: DataTypes.STRING(10), allowNull: true },
		newPerDay: { type: DataTypes.INTEGER, allowNull: false },
		keys: { type: DataTypes.TEXT, allowNull: true, ...jsonText('keys', null) },
		qualities: {
			type: DataTypes.TEXT,
			allowNull: false,
			defaultValue: '[]',
			...jsonText('qualities', [])
		},
		targetTempo: { type: DataTypes.INTEGER, allowNull: true },
		pausedAt: { type: DataTypes.DATE, allowNull: true }
	});
}
