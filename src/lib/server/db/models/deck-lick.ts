import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { bindTable, serialKey } from './table';
import type { Deck } from './deck';
import type { Lick } from './lick';

/** A lick's place in a deck; a lick is in a deck at most once (unique deck, lick). */
export class DeckLick extends Model<InferAttributes<DeckLick>, InferCreationAttributes<DeckLick>> {
	declare id: CreationOptional<number>;
	declare deckId: ForeignKey<Deck['id']>;
	declare lickId: ForeignKey<Lick['id']>;
	/** 0-based order within the deck. */
	declare position: number;
}

export function initDeckLick(sequelize: Sequelize): void {
	bindTable(DeckLick, sequelize, 'deck_licks', 'none', {
		id: serialKey(),
		position: { type: DataTypes.INTEGER, allowNull: false }
	});
}
