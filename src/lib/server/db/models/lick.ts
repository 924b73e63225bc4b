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

export const VISIBILITIES = ['private', 'classes', 'public'] as const;
export type Visibility = (typeof VISIBILITIES)[number];

/** A lick, stored once at concert pitch; every key, quality and instrument is computed from it. */
export class Lick extends Model<InferAttributes<Lick>, InferCreationAttributes<Lick>> {
	declare id: CreationOptional<string>;
	declare authorId: ForeignKey<User['id']>;
	declare title: string;
	/** abc 2.1 text at concert pitch. */
	declare abc: string;
	/** Tonic of the home key ('Eb', 'F#'), read from K: unless the author overrides it. */
	declare homeKey: string;
	/** Engine quality id of the chord it was written over ('7', 'm7', …). */
	declare homeQuality: string;
	/** Teaching note, Markdown (rendered with raw HTML off). */
	declare note: CreationOptional<string>;
	/** Target tempo, quarter notes a minute. */
	declare tempo: number;
	/** Long:short ratio of paired eighths; 1 is straight. */
	declare swingRatio: CreationOptional<number>;
	declare visibility: CreationOptional<Visibility>;
	/** Slug of the public share link; null until the lick is shared. */
	declare shareSlug: CreationOptional<string | null>;
	/** Storage key, detected MIME type and size of the reference recording. */
	declare recordingKey: CreationOptional<string | null>;
	declare recordingType: CreationOptional<string | null>;
	declare recordingSize: CreationOptional<number | null>;
	/** The lick this one was copied from. */
	declare copiedFromId: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initLick(sequelize: Sequelize): void {
	bindTable(Lick, sequelize, 'licks', 'created-updated', {
		id: uuidKey(),
		title: { type: DataTypes.STRING(200), allowNull: false },
		abc: { type: DataTypes.TEXT, allowNull: false },
		homeKey: { type: DataTypes.STRING(8), allowNull: false },
		homeQuality: { type: DataTypes.STRING(16), allowNull: false },
		note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
		tempo: { type: DataTypes.INTEGER, allowNull: false },
		swingRatio: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 2 },
		visibility: {
			type: DataTypes.STRING(16),
			allowNull: false,
			defaultValue: 'private',
			validate: { isIn: [VISIBILITIES as unknown as string[]] }
		},
		shareSlug: { type: DataTypes.STRING(32), allowNull: true },
		recordingKey: { type: DataTypes.STRING(200), allowNull: true },
		recordingType: { type: DataTypes.STRING(40), allowNull: true },
		recordingSize: { type: DataTypes.INTEGER, allowNull: true },
		copiedFromId: { type: DataTypes.UUID, allowNull: true }
	});
}
