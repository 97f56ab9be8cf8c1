// Initialises every model on one Sequelize instance and wires the associations.
// The one barrel file allowed (STYLE.md §2): later issues add their init and associations here.
import type { Sequelize } from 'sequelize';
import { BearingType, initBearingType } from './bearing-type';
import { Belt, initBelt } from './belt';
import { DriveComponent, initDriveComponent } from './drive-component';
import { Engine, initEngine } from './engine';
import { EngineRevision, initEngineRevision } from './engine-revision';
import { Invite, initInvite } from './invite';
import { MailMessage, initMailMessage } from './mail-message';
import { PasswordReset, initPasswordReset } from './password-reset';
import { Session, initSession } from './session';
import { Shop, initShop } from './shop';
import { User, initUser } from './user';

export { BearingType, Belt, DriveComponent, Engine, EngineRevision, Invite, MailMessage, PasswordReset, Session, Shop, User };

/** Initialises the models on `sequelize` and defines their associations. Idempotent per instance. */
export function initModels(sequelize: Sequelize): void {
  initShop(sequelize);
  initUser(sequelize);
  initSession(sequelize);
  initInvite(sequelize);
  initPasswordReset(sequelize);
  initMailMessage(sequelize);
  initBearingType(sequelize);
  initEngine(sequelize);
  initBelt(sequelize);
  initDriveComponent(sequelize);
  initEngineRevision(sequelize);

  Shop.hasMany(User, { foreignKey: 'shopId', as: 'users' });
  User.belongsTo(Shop, { foreignKey: 'shopId', as: 'shop' });
  Shop.hasMany(Invite, { foreignKey: 'shopId', as: 'invites' });
  Invite.belongsTo(Shop, { foreignKey: 'shopId', as: 'shop' });
  Invite.belongsTo(User, { foreignKey: 'invitedById', as: 'invitedBy' });
  PasswordReset.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  MailMessage.belongsTo(Shop, { foreignKey: 'shopId', as: 'shop' });
  // Drive library: an engine's belts and components (written as a whole by services/engine-drive.ts).
  Shop.hasMany(BearingType, { foreignKey: 'shopId' });
  Shop.hasMany(Engine, { foreignKey: 'shopId' });
  Shop.hasMany(Belt, { foreignKey: 'shopId' });
  Shop.hasMany(DriveComponent, { foreignKey: 'shopId' });
  Engine.hasMany(Belt, { foreignKey: 'engineId', as: 'belts' });
  Engine.hasMany(DriveComponent, { foreignKey: 'engineId', as: 'components' });
  Belt.belongsTo(DriveComponent, { foreignKey: 'driverComponentId', as: 'driverComponent', constraints: false });
  DriveComponent.belongsTo(Belt, { foreignKey: 'beltId', as: 'belt', constraints: false });
  Engine.hasMany(EngineRevision, { foreignKey: 'engineId', as: 'revisions' });
  Shop.hasMany(EngineRevision, { foreignKey: 'shopId' });
}
