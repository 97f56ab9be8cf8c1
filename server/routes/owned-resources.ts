// Shop-owned records a route row can name by id (`ownedParam`): how to find one within a shop.
// Later issues add their resources here (engine, case, capture…), plus a factory in tests/helpers/factories.ts.
import type { Model } from 'sequelize';
import { Analysis, BearingType, Capture, Case, Engine, Finding, Invite, MailMessage, User } from '../models';

type Finder = (shopId: number, id: number) => Promise<Model | null>;

/** resource name → finder scoped to the shop. */
export const ownedResources = {
  user: (shopId, id) => User.findOne({ where: { id, shopId } }),
  invite: (shopId, id) => Invite.findOne({ where: { id, shopId } }),
  mail: (shopId, id) => MailMessage.findOne({ where: { id, shopId } }),
  engine: (shopId, id) => Engine.findOne({ where: { id, shopId } }),
  bearing: (shopId, id) => BearingType.findOne({ where: { id, shopId } }),
  case: (shopId, id) => Case.findOne({ where: { id, shopId } }),
  capture: (shopId, id) => Capture.findOne({ where: { id, shopId } }),
  analysis: (shopId, id) => Analysis.findOne({ where: { id, shopId } }),
  finding: (shopId, id) => Finding.findOne({ where: { id, shopId } }),
} satisfies Record<string, Finder>;

/** A resource name usable in a route row. */
export type OwnedResource = keyof typeof ownedResources;
