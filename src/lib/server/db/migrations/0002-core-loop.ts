import { DataTypes } from 'sequelize';
import type { Migration } from './types';

/**
 * The tables of the core loop: licks and their hand-written versions, tags and decks (the
 * library); cards and the review log (the drill); classes, members, invitations, assignments and
 * comments; the record of each mail sent once per person and day (the digest). Plus the settings
 * the server queries, as indexed columns on `users`.
 *
 * Rules that must hold with two processes or on PostgreSQL are constraints here: unique keys
 * (one card per learner, lick and quality; one review per client id; one mail per person, kind
 * and day) and CHECKs on every closed set of values (strings, not ENUM, so that a new value needs
 * no `ALTER TYPE`). A CHECK rides in the column type, the one place `createTable` passes through
 * unchanged on both dialects.
 */

const uuidKey = { type: DataTypes.UUID, primaryKey: true, allowNull: false };
const createdAt = { type: DataTypes.DATE, allowNull: false };
const updatedAt = { type: DataTypes.DATE, allowNull: false };

function ref(table: string, onDelete: 'CASCADE' | 'SET NULL' = 'CASCADE', allowNull = false) {
	return {
		type: DataTypes.UUID,
		allowNull,
		references: { model: table, key: 'id' },
		onDelete,
		onUpdate: 'CASCADE'
	};
}

/** A string column limited to a closed set of values. */
function oneOf(column: string, values: readonly string[], length = 16) {
	const list = values.map((v) => `'${v}'`).join(', ');
	return `VARCHAR(${length}) CHECK (${column} IN (${list}))`;
}

export const coreLoop: Migration = {
	name: '0002-core-loop',
	async up({ context: qi }) {
		// Settings the server queries (the digest finds "whose hour has come" with one indexed
		// query; the drill needs the learner's day boundary). The rest stays in the JSON column.
		await qi.addColumn('users', 'timezone', {
			type: DataTypes.STRING(64),
			allowNull: false,
			defaultValue: 'UTC'
		});
		await qi.addColumn('users', 'digest_hour', {
			type: 'INTEGER CHECK (digest_hour BETWEEN 0 AND 23)',
			allowNull: false,
			defaultValue: 7
		});
		await qi.addColumn('users', 'digest_enabled', {
			type: DataTypes.BOOLEAN,
			allowNull: false,
			defaultValue: true
		});
		await qi.addColumn('users', 'day_start_hour', {
			type: 'INTEGER CHECK (day_start_hour BETWEEN 0 AND 23)',
			allowNull: false,
			defaultValue: 4
		});
		await qi.addIndex('users', ['digest_enabled', 'digest_hour', 'timezone'], {
			name: 'users_digest_due'
		});

		await qi.createTable('licks', {
			id: uuidKey,
			author_id: ref('users'),
			title: { type: DataTypes.STRING(200), allowNull: false },
			/** abc 2.1 text at concert pitch. */
			abc: { type: DataTypes.TEXT, allowNull: false },
			/** Tonic of the home key as written in K: ('Eb', 'F#'), mode left out. */
			home_key: { type: DataTypes.STRING(8), allowNull: false },
			/** Engine quality id of the chord it was written over ('7', 'm7', 'maj7', …). */
			home_quality: { type: DataTypes.STRING(16), allowNull: false },
			/** Teaching note, Markdown. */
			note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
			/** Target tempo in quarter notes a minute. */
			tempo: { type: 'INTEGER CHECK (tempo BETWEEN 20 AND 400)', allowNull: false },
			/** Long:short ratio of paired eighths; 1 is straight. */
			swing_ratio: {
				type: 'REAL CHECK (swing_ratio >= 1 AND swing_ratio <= 4)',
				allowNull: false,
				defaultValue: 2
			},
			visibility: {
				type: oneOf('visibility', ['private', 'classes', 'public']),
				allowNull: false,
				defaultValue: 'private'
			},
			/** Short unguessable slug of the public share link; null until shared. */
			share_slug: { type: DataTypes.STRING(32), allowNull: true, unique: true },
			/** Storage key of the reference recording, with its detected type and size. */
			recording_key: { type: DataTypes.STRING(200), allowNull: true },
			recording_type: { type: DataTypes.STRING(40), allowNull: true },
			recording_size: { type: DataTypes.INTEGER, allowNull: true },
			/** The lick this one was copied from (share link, demo), kept for credit. */
			copied_from_id: ref('licks', 'SET NULL', true),
			created_at: createdAt,
			updated_at: updatedAt
		});
		await qi.addIndex('licks', ['author_id', 'updated_at'], { name: 'licks_author_updated' });
		await qi.addIndex('licks', ['author_id', 'title'], { name: 'licks_author_title' });
		await qi.addIndex('licks', ['visibility'], { name: 'licks_visibility' });

		await qi.createTable('lick_versions', {
			id: uuidKey,
			lick_id: ref('licks'),
			quality: { type: DataTypes.STRING(16), allowNull: false },
			abc: { type: DataTypes.TEXT, allowNull: false },
			created_at: createdAt,
			updated_at: updatedAt
		});
		await qi.addIndex('lick_versions', ['lick_id', 'quality'], {
			name: 'lick_versions_lick_quality',
			unique: true
		});

		await qi.createTable('lick_tags', {
			id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
			lick_id: ref('licks'),
			/** Lower-case; the trade's device names or free words. */
			tag: { type: DataTypes.STRING(40), allowNull: false }
		});
		await qi.addIndex('lick_tags', ['lick_id', 'tag'], {
			name: 'lick_tags_lick_tag',
			unique: true
		});
		await qi.addIndex('lick_tags', ['tag'], { name: 'lick_tags_tag' });

		await qi.createTable('decks', {
			id: uuidKey,
			owner_id: ref('users'),
			name: { type: DataTypes.STRING(120), allowNull: false },
			description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
			created_at: createdAt,
			updated_at: updatedAt
		});
		await qi.addIndex('decks', ['owner_id', 'name'], { name: 'decks_owner_name' });

		await qi.createTable('deck_licks', {
			id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
			deck_id: ref('decks'),
			lick_id: ref('licks'),
			position: { type: DataTypes.INTEGER, allowNull: false }
		});
		await qi.addIndex('deck_licks', ['deck_id', 'lick_id'], {
			name: 'deck_licks_deck_lick',
			unique: true
		});
		await qi.addIndex('deck_licks', ['deck_id', 'position'], { name: 'deck_licks_deck_position' });
		await qi.addIndex('deck_licks', ['lick_id'], { name: 'deck_licks_lick' });

		await qi.createTable('classes', {
			id: uuidKey,
			teacher_id: ref('users'),
			name: { type: DataTypes.STRING(120), allowNull: false },
			/** Short join code typed by a learner; null when turned off. */
			join_code: { type: DataTypes.STRING(16), allowNull: true, unique: true },
			/** Unguessable token of the invite link; null when turned off. */
			join_token: { type: DataTypes.STRING(64), allowNull: true, unique: true },
			archived_at: { type: DataTypes.DATE, allowNull: true },
			created_at: createdAt,
			updated_at: updatedAt
		});
		await qi.addIndex('classes', ['teacher_id'], { name: 'classes_teacher' });

		await qi.createTable('class_members', {
			id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
			class_id: ref('classes'),
			user_id: ref('users'),
			joined_at: { type: DataTypes.DATE, allowNull: false }
		});
		await qi.addIndex('class_members', ['class_id', 'user_id'], {
			name: 'class_members_class_user',
			unique: true
		});
		await qi.addIndex('class_members', ['user_id'], { name: 'class_members_user' });

		await qi.createTable('class_invitations', {
			id: uuidKey,
			class_id: ref('classes'),
			email: { type: DataTypes.STRING(254), allowNull: false },
			/** SHA-256 hex of the token mailed; the token itself is never stored. */
			token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
			invited_by_id: ref('users'),
			expires_at: { type: DataTypes.DATE, allowNull: false },
			accepted_at: { type: DataTypes.DATE, allowNull: true },
			created_at: createdAt
		});
		await qi.addIndex('class_invitations', ['class_id', 'email'], {
			name: 'class_invitations_class_email'
		});

		await qi.createTable('assignments', {
			id: uuidKey,
			class_id: ref('classes'),
			deck_id: ref('decks'),
			/** First local day (YYYY-MM-DD) new cards arrive; optional last one. */
			start_date: { type: DataTypes.STRING(10), allowNull: false },
			end_date: { type: DataTypes.STRING(10), allowNull: true },
			new_per_day: { type: 'INTEGER CHECK (new_per_day BETWEEN 1 AND 50)', allowNull: false },
			/** JSON array of key tonics to drill; null means all twelve. */
			keys: { type: DataTypes.TEXT, allowNull: true },
			/** JSON array of chord qualities drilled besides each lick's home quality. */
			qualities: { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' },
			target_tempo: { type: 'INTEGER CHECK (target_tempo BETWEEN 20 AND 400)', allowNull: true },
			paused_at: { type: DataTypes.DATE, allowNull: true },
			created_at: createdAt,
			updated_at: updatedAt
		});
		await qi.addIndex('assignments', ['class_id'], { name: 'assignments_class' });
		await qi.addIndex('assignments', ['deck_id'], { name: 'assignments_deck' });

		await qi.createTable('cards', {
			id: uuidKey,
			user_id: ref('users'),
			lick_id: ref('licks'),
			quality: { type: DataTypes.STRING(16), allowNull: false },
			/** Where the card came from; null when the learner added it. Sets the pace of new cards. */
			assignment_id: ref('assignments', 'SET NULL', true),
			/** Order among the learner's new cards (lower first). */
			new_position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
			/** Local day (YYYY-MM-DD) the card was first shown; null while it is new. */
			introduced_day: { type: DataTypes.STRING(10), allowNull: true },
			/** Set when its source stopped (assignment removed, learner left): no longer introduced. */
			retired_at: { type: DataTypes.DATE, allowNull: true },
			// FSRS state, as ts-fsrs' Card (elapsed_days left out: deprecated in ts-fsrs 6).
			due: { type: DataTypes.DATE, allowNull: false },
			stability: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
			difficulty: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
			scheduled_days: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
			learning_steps: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
			reps: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
			lapses: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
			/** ts-fsrs State: 0 new, 1 learning, 2 review, 3 relearning. */
			state: { type: 'INTEGER CHECK (state BETWEEN 0 AND 3)', allowNull: false, defaultValue: 0 },
			last_review: { type: DataTypes.DATE, allowNull: true },
			/** Tempo ladder: the tempo at which the card was last played well. */
			tempo: { type: DataTypes.INTEGER, allowNull: true },
			/** Bumped on every write; updates compare it (compare-and-set). */
			version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
			created_at: createdAt,
			updated_at: updatedAt
		});
		await qi.addIndex('cards', ['user_id', 'lick_id', 'quality'], {
			name: 'cards_user_lick_quality',
			unique: true
		});
		await qi.addIndex('cards', ['user_id', 'state', 'due'], { name: 'cards_user_state_due' });
		await qi.addIndex('cards', ['lick_id'], { name: 'cards_lick' });
		await qi.addIndex('cards', ['assignment_id'], { name: 'cards_assignment' });

		await qi.createTable('reviews', {
			id: uuidKey,
			card_id: ref('cards'),
			user_id: ref('users'),
			lick_id: ref('licks'),
			/** Made by the client; the same id twice is one review. */
			client_id: { type: DataTypes.STRING(64), allowNull: false },
			/** The practice sitting the review belongs to (client-made id). */
			sitting_id: { type: DataTypes.STRING(64), allowNull: true },
			reviewed_at: { type: DataTypes.DATE, allowNull: false },
			/** The learner's practice day (YYYY-MM-DD, their zone and day-start hour). */
			day: { type: DataTypes.STRING(10), allowNull: false },
			grade: { type: 'INTEGER CHECK (grade BETWEEN 1 AND 4)', allowNull: false },
			key: { type: DataTypes.STRING(4), allowNull: false },
			quality: { type: DataTypes.STRING(16), allowNull: false },
			tempo: { type: DataTypes.INTEGER, allowNull: true },
			reveal_ms: { type: DataTypes.INTEGER, allowNull: true },
			grade_ms: { type: DataTypes.INTEGER, allowNull: true },
			/** The card's FSRS state before and after, JSON, so that undo restores it exactly. */
			state_before: { type: DataTypes.TEXT, allowNull: false },
			state_after: { type: DataTypes.TEXT, allowNull: false },
			/** Set when the learner undid it; the row stays for the record and counts nowhere. */
			undone_at: { type: DataTypes.DATE, allowNull: true },
			created_at: createdAt
		});
		await qi.addIndex('reviews', ['user_id', 'client_id'], {
			name: 'reviews_user_client',
			unique: true
		});
		await qi.addIndex('reviews', ['user_id', 'day'], { name: 'reviews_user_day' });
		await qi.addIndex('reviews', ['card_id', 'reviewed_at'], { name: 'reviews_card_time' });
		await qi.addIndex('reviews', ['user_id', 'lick_id', 'key'], { name: 'reviews_user_lick_key' });

		await qi.createTable('comments', {
			id: uuidKey,
			card_id: ref('cards'),
			author_id: ref('users'),
			text: { type: DataTypes.TEXT, allowNull: false },
			/** When the other party first saw it (the learner at a reveal, the teacher on a page). */
			seen_at: { type: DataTypes.DATE, allowNull: true },
			created_at: createdAt
		});
		await qi.addIndex('comments', ['card_id', 'created_at'], { name: 'comments_card_time' });

		await qi.createTable('mail_sends', {
			id: uuidKey,
			user_id: ref('users'),
			kind: { type: oneOf('kind', ['digest', 'summary']), allowNull: false },
			/** Local day (YYYY-MM-DD) of the recipient the mail belongs to. */
			day: { type: DataTypes.STRING(10), allowNull: false },
			status: {
				type: oneOf('status', ['claimed', 'sent', 'failed', 'skipped']),
				allowNull: false
			},
			attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
			next_attempt_at: { type: DataTypes.DATE, allowNull: true },
			last_error: { type: DataTypes.TEXT, allowNull: true },
			sent_at: { type: DataTypes.DATE, allowNull: true },
			created_at: createdAt,
			updated_at: updatedAt
		});
		await qi.addIndex('mail_sends', ['user_id', 'kind', 'day'], {
			name: 'mail_sends_user_kind_day',
			unique: true
		});
		await qi.addIndex('mail_sends', ['status', 'next_attempt_at'], { name: 'mail_sends_retry' });
	},
	async down({ context: qi }) {
		for (const table of [
			'mail_sends',
			'comments',
			'reviews',
			'cards',
			'assignments',
			'class_invitations',
			'class_members',
			'classes',
			'deck_licks',
			'decks',
			'lick_tags',
			'lick_versions',
			'licks'
		]) {
			await qi.dropTable(table);
		}
		await qi.removeIndex('users', 'users_digest_due');
		for (const column of ['day_start_hour', 'digest_enabled', 'digest_hour', 'timezone']) {
			await qi.removeColumn('users', column);
		}
	}
};
