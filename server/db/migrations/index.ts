// Every migration, in order. Imported statically (not globbed) so the esbuild bundle carries them.
// Add a new file's import at the end of this list.
import type { MigrationModule } from '../migrator';
import { migration as createShops } from './202612020300-create-shops';
import { migration as createUsers } from './202612020301-create-users';
import { migration as createSessions } from './202612020302-create-sessions';
import { migration as createInvites } from './202612020303-create-invites';
import { migration as createPasswordResets } from './202612020304-create-password-resets';
import { migration as createMailMessages } from './202612020305-create-mail-messages';
import { migration as createBearingTypes } from './202612020400-create-bearing-types';
import { migration as createEngines } from './202612020401-create-engines';
import { migration as createBelts } from './202612020402-create-belts';
import { migration as createDriveComponents } from './202612020403-create-drive-components';
import { migration as addShopSettings } from './202612030745-add-shop-settings';
import { migration as addEngineVersion } from './202612030746-add-engine-version';
import { migration as createEngineRevisions } from './202612030747-create-engine-revisions';
import { migration as addComponentMeasured } from './202612030748-add-component-measured';
import { migration as createCases } from './202612030800-create-cases';
import { migration as createCaseEvents } from './202612030801-create-case-events';
import { migration as createCaptures } from './202612030802-create-captures';
import { migration as createAnalyses } from './202612030803-create-analyses';
import { migration as createAnalysisSeries } from './202612030804-create-analysis-series';
import { migration as createFindings } from './202612030805-create-findings';
import { migration as addMailAttachments } from './202612030900-add-mail-attachments';
import { migration as createRatioCalibrations } from './202612030900-create-ratio-calibrations';

/** The ordered list umzug runs. */
export const migrations: MigrationModule[] = [
  createShops,
  createUsers,
  createSessions,
  createInvites,
  createPasswordResets,
  createMailMessages,
  createBearingTypes,
  createEngines,
  createBelts,
  createDriveComponents,
  addShopSettings,
  addEngineVersion,
  createEngineRevisions,
  addComponentMeasured,
  createCases,
  createCaseEvents,
  createCaptures,
  createAnalyses,
  createAnalysisSeries,
  createFindings,
  addMailAttachments,
  createRatioCalibrations,
];
