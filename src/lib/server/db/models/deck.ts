import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { User } from './user';

/** A named, ordered list of licks (order in `DeckLick.position`). Deleting it keeps the licks. */
export class Deck extends Model<InferAttributes<Deck>, InferCreationAttributes<Deck>> {
	declare id: CreationOptional<string>;
	declare ownerId: ForeignKey<User['id']>;
	declare name: string;
	declare description: CreationOptional<string>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initDeck(sequelize: Sequelize): void {
	Deck.init(
		{
			id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
			name: { type: DataTypes.STRING(120), allowNull: false },
			description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'decks', underscored: true }
	);
}
