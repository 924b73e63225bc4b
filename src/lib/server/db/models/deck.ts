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
	bindTable(Deck, sequelize, 'decks', 'created-updated', {
		id: uuidKey(),
		name: { type: DataTypes.STRING(120), allowNull: false },
		description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' }
	});
}
