// Every migration, in order. Imported statically (not globbed) so the esbuild bundle carries them.
// Add a new file's import at the end of this list.
import type { MigrationModule } from '../migrator';
import { migration as createShops } from './202612020300-create-shops';
import { migration as createUsers } from './202612020301-create-users';
import { migration as createSessions } from './202612020302-create-sessions';
import { migration as createInvites } from './202612020303-create-invites';
import { migration as createPasswordResets } from './202612020304-create-password-resets';
import { migration as createMailMessages } from './202612020305-create-mail-messages';

/** The ordered list umzug runs. */
export const migrations: MigrationModule[] = [
  createShops,
  createUsers,
  createSessions,
  createInvites,
  createPasswordResets,
  createMailMessages,
];
