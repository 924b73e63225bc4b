import type { Model, ModelStatic, Sequelize } from 'sequelize';
import { User, initUser } from './user';
import { Session, initSession } from './session';
import { EmailToken, initEmailToken } from './email-token';
import { Lick, initLick } from './lick';
import { LickVersion, initLickVersion } from './lick-version';
import { LickTag, initLickTag } from './lick-tag';
import { Deck, initDeck } from './deck';
import { DeckLick, initDeckLick } from './deck-lick';
import { ClassGroup, initClassGroup } from './class';
import { ClassMember, initClassMember } from './class-member';
import { ClassInvitation, initClassInvitation } from './class-invitation';
import { Assignment, initAssignment } from './assignment';
import { Card, initCard } from './card';
import { Review, initReview } from './review';
import { Comment, initComment } from './comment';
import { MailSend, initMailSend } from './mail-send';

export {
	User,
	Session,
	EmailToken,
	Lick,
	LickVersion,
	LickTag,
	Deck,
	DeckLick,
	ClassGroup,
	ClassMember,
	ClassInvitation,
	Assignment,
	Card,
	Review,
	Comment,
	MailSend
};
export { ROLES, type Role } from './user';
export { TOKEN_PURPOSES, type TokenPurpose } from './email-token';
export { VISIBILITIES, type Visibility } from './lick';
export { MAIL_KINDS, type MailKind, MAIL_SEND_STATUSES, type MailSendStatus } from './mail-send';

type Cascade = 'CASCADE' | 'SET NULL';

/**
 * `parent` owns `child` through `key`: Sequelize learns both directions. The database does the
 * deleting (ON DELETE in the migrations); `onDelete` is stated on the owning side only, because
 * on both sides Sequelize's own cascade walks back and forth between the two models without end.
 */
function owns(
	parent: ModelStatic<Model>,
	child: ModelStatic<Model>,
	key: string,
	options: { onDelete?: Cascade; allowNull?: boolean } = {}
): void {
	const allowNull = options.allowNull ?? false;
	parent.hasMany(child, {
		foreignKey: { name: key, allowNull },
		onDelete: options.onDelete ?? 'CASCADE'
	});
	child.belongsTo(parent, { foreignKey: { name: key, allowNull } });
}

/**
 * Bind every model to a Sequelize instance and declare the associations, all in one place.
 * Model classes are module singletons: they follow the instance bound last (`openDb`).
 */
export function initModels(sequelize: Sequelize): void {
	initUser(sequelize);
	initSession(sequelize);
	initEmailToken(sequelize);
	initLick(sequelize);
	initLickVersion(sequelize);
	initLickTag(sequelize);
	initDeck(sequelize);
	initDeckLick(sequelize);
	initClassGroup(sequelize);
	initClassMember(sequelize);
	initClassInvitation(sequelize);
	initAssignment(sequelize);
	initCard(sequelize);
	initReview(sequelize);
	initComment(sequelize);
	initMailSend(sequelize);

	owns(User, Session, 'userId');
	owns(User, EmailToken, 'userId');

	owns(User, Lick, 'authorId');
	owns(Lick, LickVersion, 'lickId');
	owns(Lick, LickTag, 'lickId');
	owns(User, Deck, 'ownerId');
	owns(Deck, DeckLick, 'deckId');
	owns(Lick, DeckLick, 'lickId');

	owns(User, ClassGroup, 'teacherId');
	owns(ClassGroup, ClassMember, 'classId');
	owns(User, ClassMember, 'userId');
	owns(ClassGroup, ClassInvitation, 'classId');
	owns(User, ClassInvitation, 'invitedById');
	owns(ClassGroup, Assignment, 'classId');
	owns(Deck, Assignment, 'deckId');

	owns(User, Card, 'userId');
	owns(Lick, Card, 'lickId');
	owns(Assignment, Card, 'assignmentId', { onDelete: 'SET NULL', allowNull: true });
	owns(Card, Review, 'cardId');
	owns(User, Review, 'userId');
	owns(Lick, Review, 'lickId');
	owns(Card, Comment, 'cardId');
	owns(User, Comment, 'authorId');
	owns(User, MailSend, 'userId');
}
