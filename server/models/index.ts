// Initialises every model on one Sequelize instance and wires the associations.
// The one barrel file allowed (STYLE.md §2): later issues add their init and associations here.
import type { Sequelize } from 'sequelize';
import { Analysis, initAnalysis } from './analysis';
import { AnalysisSeries, initAnalysisSeries } from './analysis-series';
import { BearingType, initBearingType } from './bearing-type';
import { Belt, initBelt } from './belt';
import { Capture, initCapture } from './capture';
import { Case, initCase } from './case';
import { CaseEvent, initCaseEvent } from './case-event';
import { DriveComponent, initDriveComponent } from './drive-component';
import { Engine, initEngine } from './engine';
import { Finding, initFinding } from './finding';
import { EngineRevision, initEngineRevision } from './engine-revision';
import { Invite, initInvite } from './invite';
import { MailMessage, initMailMessage } from './mail-message';
import { PasswordReset, initPasswordReset } from './password-reset';
import { RatioCalibration, initRatioCalibration } from './ratio-calibration';
import { Session, initSession } from './session';
import { Shop, initShop } from './shop';
import { User, initUser } from './user';

export { Analysis, AnalysisSeries, Capture, Case, CaseEvent, Finding };
export { BearingType, Belt, DriveComponent, Engine, EngineRevision, Invite, MailMessage, PasswordReset, Session, Shop, User };
export { RatioCalibration };

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
  initCase(sequelize);
  initCaseEvent(sequelize);
  initCapture(sequelize);
  initAnalysis(sequelize);
  initAnalysisSeries(sequelize);
  initFinding(sequelize);
  initEngineRevision(sequelize);
  initRatioCalibration(sequelize);

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
  // Cases (issue 15): a case's people and engine, its timeline, captures, analyses and findings.
  Case.belongsTo(Engine, { foreignKey: 'engineId', as: 'engine', constraints: false });
  Case.belongsTo(User, { foreignKey: 'technicianId', as: 'technician', constraints: false });
  Case.belongsTo(User, { foreignKey: 'leadId', as: 'lead', constraints: false });
  CaseEvent.belongsTo(User, { foreignKey: 'actorId', as: 'actor', constraints: false });
  Capture.belongsTo(User, { foreignKey: 'uploadedById', as: 'uploadedBy', constraints: false });
  Analysis.belongsTo(Capture, { foreignKey: 'captureId', as: 'capture', constraints: false });
  Finding.belongsTo(User, { foreignKey: 'decidedById', as: 'decidedBy', constraints: false });
  Engine.hasMany(EngineRevision, { foreignKey: 'engineId', as: 'revisions' });
  Shop.hasMany(EngineRevision, { foreignKey: 'shopId' });
}
