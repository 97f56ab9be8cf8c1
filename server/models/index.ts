// Initialises every model on one Sequelize instance and wires the associations.
// The one barrel file allowed (STYLE.md §2): later issues add their init and associations here.
import type { Sequelize } from 'sequelize';
import { Invite, initInvite } from './invite';
import { MailMessage, initMailMessage } from './mail-message';
import { PasswordReset, initPasswordReset } from './password-reset';
import { Session, initSession } from './session';
import { Shop, initShop } from './shop';
import { User, initUser } from './user';

export { Invite, MailMessage, PasswordReset, Session, Shop, User };

/** Initialises the models on `sequelize` and defines their associations. Idempotent per instance. */
export function initModels(sequelize: Sequelize): void {
  initShop(sequelize);
  initUser(sequelize);
  initSession(sequelize);
  initInvite(sequelize);
  initPasswordReset(sequelize);
  initMailMessage(sequelize);

  Shop.hasMany(User, { foreignKey: 'shopId', as: 'users' });
  User.belongsTo(Shop, { foreignKey: 'shopId', as: 'shop' });
  Shop.hasMany(Invite, { foreignKey: 'shopId', as: 'invites' });
  Invite.belongsTo(Shop, { foreignKey: 'shopId', as: 'shop' });
  Invite.belongsTo(User, { foreignKey: 'invitedById', as: 'invitedBy' });
  PasswordReset.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  MailMessage.belongsTo(Shop, { foreignKey: 'shopId', as: 'shop' });
}
