import type { Sequelize } from 'sequelize';
import { User, initUser } from './user';
import { Session, initSession } from './session';
import { EmailToken, initEmailToken } from './email-token';

export { User, Session, EmailToken };
export { ROLES, type Role } from './user';
export { TOKEN_PURPOSES, type TokenPurpose } from './email-token';

/**
 * Bind every model to a Sequelize instance and declare the associations, all in one place.
 * Model classes are module singletons: they follow the instance bound last (`openDb`).
 */
export function initModels(sequelize: Sequelize): void {
	initUser(sequelize);
	initSession(sequelize);
	initEmailToken(sequelize);

	// Deleting a user removes everything that belongs to them. The database does it (ON DELETE
	// CASCADE in the migrations); `onDelete` is stated on the owning side only, because on both
	// sides Sequelize's own cascade walks back and forth between the two models without end.
	const owned = { foreignKey: { name: 'userId', allowNull: false }, onDelete: 'CASCADE' } as const;
	const owner = { foreignKey: { name: 'userId', allowNull: false } } as const;
	User.hasMany(Session, owned);
	Session.belongsTo(User, owner);
	User.hasMany(EmailToken, owned);
	EmailToken.belongsTo(User, owner);
}
