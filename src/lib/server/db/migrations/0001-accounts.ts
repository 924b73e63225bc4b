import { DataTypes } from 'sequelize';
import type { Migration } from './types';

/** Accounts, sessions and the single-use tokens sent by mail. */
export const accounts: Migration = {
	name: '0001-accounts',
	async up({ context: qi }) {
		await qi.createTable('users', {
			id: { type: DataTypes.UUID, primaryKey: true, allowNull: false },
			email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
			name: { type: DataTypes.STRING(100), allowNull: false },
			role: {
				type: DataTypes.ENUM('learner', 'teacher', 'admin'),
				allowNull: false,
				defaultValue: 'learner'
			},
			password_hash: { type: DataTypes.STRING(255), allowNull: false },
			email_verified_at: { type: DataTypes.DATE, allowNull: true },
			settings: { type: DataTypes.JSON, allowNull: false },
			created_at: { type: DataTypes.DATE, allowNull: false },
			updated_at: { type: DataTypes.DATE, allowNull: false }
		});

		const userRef = {
			type: DataTypes.UUID,
			allowNull: false,
			references: { model: 'users', key: 'id' },
			onDelete: 'CASCADE',
			onUpdate: 'CASCADE'
		};

		await qi.createTable('sessions', {
			id: { type: DataTypes.STRING(64), primaryKey: true, allowNull: false },
			user_id: userRef,
			expires_at: { type: DataTypes.DATE, allowNull: false },
			created_at: { type: DataTypes.DATE, allowNull: false }
		});
		await qi.addIndex('sessions', ['user_id'], { name: 'sessions_user_id' });
		await qi.addIndex('sessions', ['expires_at'], { name: 'sessions_expires_at' });

		await qi.createTable('email_tokens', {
			id: { type: DataTypes.STRING(64), primaryKey: true, allowNull: false },
			user_id: userRef,
			purpose: { type: DataTypes.ENUM('verify', 'reset'), allowNull: false },
			expires_at: { type: DataTypes.DATE, allowNull: false },
			used_at: { type: DataTypes.DATE, allowNull: true },
			created_at: { type: DataTypes.DATE, allowNull: false }
		});
		await qi.addIndex('email_tokens', ['user_id', 'purpose'], {
			name: 'email_tokens_user_id_purpose'
		});
	},
	async down({ context: qi }) {
		await qi.dropTable('email_tokens');
		await qi.dropTable('sessions');
		await qi.dropTable('users');
	}
};
