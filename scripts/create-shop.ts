// `npm run create-shop -- --name "Shop" --admin-email a@b.test [--admin-name "Name"] [--password …]`
// Creates a real shop and its first admin (all or nothing). Uses DATABASE_URL, or starts the
// project's own MariaDB like `npm start` does. Exit 2 with one line on bad input, 1 on other errors.
import { randomBytes } from 'node:crypto';
import { parseArgs } from 'node:util';
import { z } from 'zod';
import { startDatabase, type RunningDatabase } from './db';
import { createSequelize } from '../server/db/sequelize';
import { migrate } from '../server/db/migrator';
import { parseEnv } from '../server/env';
import { AppError } from '../server/errors';
import { createShop } from '../server/services/create-shop';
import { EmailSchema, PasswordSchema, PersonNameSchema } from '../shared/schemas/common';
import { ShopNameSchema } from '../shared/schemas/setup';

const USAGE = 'usage: npm run create-shop -- --name "Shop name" --admin-email you@example.com [--admin-name "Your Name"] [--password …]';

/** The validated command-line input. */
export const CreateShopArgsSchema = z.object({
  name: ShopNameSchema,
  adminEmail: EmailSchema,
  adminName: PersonNameSchema,
  password: PasswordSchema.optional(),
});
/** Parsed arguments. */
export type CreateShopArgs = z.infer<typeof CreateShopArgsSchema>;

class UsageError extends Error {}

/** Parses argv; throws UsageError with a one-line message naming the bad option. */
export function parseCreateShopArgs(argv: string[]): CreateShopArgs {
  let values: Record<string, string | boolean | undefined>;
  try {
    ({ values } = parseArgs({
      args: argv,
      options: {
        name: { type: 'string' },
        'admin-email': { type: 'string' },
        'admin-name': { type: 'string' },
        password: { type: 'string' },
      },
      strict: true,
      allowPositionals: false,
    }));
  } catch (error) {
    throw new UsageError(`${error instanceof Error ? error.message.split('\n')[0] : String(error)}; ${USAGE}`);
  }
  if (values.name === undefined) throw new UsageError(`--name is required; ${USAGE}`);
  if (values['admin-email'] === undefined) throw new UsageError(`--admin-email is required; ${USAGE}`);
  const parsed = CreateShopArgsSchema.safeParse({
    name: values.name,
    adminEmail: values['admin-email'],
    adminName: values['admin-name'] ?? 'Shop admin',
    password: values.password,
  });
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    const flag = { name: '--name', adminEmail: '--admin-email', adminName: '--admin-name', password: '--password' }[String(issue.path[0])];
    throw new UsageError(`${flag ?? String(issue.path[0])}: ${issue.message}`);
  }
  return parsed.data;
}

async function main(): Promise<number> {
  let args: CreateShopArgs;
  try {
    args = parseCreateShopArgs(process.argv.slice(2));
  } catch (error) {
    process.stderr.write(`create-shop: ${(error as Error).message}\n`);
    return 2;
  }
  const env = parseEnv();
  let db: RunningDatabase | null = null;
  let url = env.DATABASE_URL;
  if (!url) {
    db = await startDatabase({ name: 'dev-db', port: env.DB_PORT, dataDir: env.DB_DATA_DIR });
    url = db.url;
  }
  const sequelize = await createSequelize(url);
  try {
    await migrate(sequelize);
    const password = args.password ?? randomBytes(12).toString('base64url');
    const { shop, users } = await createShop(
      sequelize,
      { name: args.name, users: [{ name: args.adminName, email: args.adminEmail, password, role: 'admin' }] },
      env.BCRYPT_ROUNDS,
    );
    process.stdout.write(`Created shop "${shop.name}" (id ${shop.id}) with admin ${users[0]!.email}\n`);
    if (!args.password) process.stdout.write(`Generated password (shown once, change it after signing in): ${password}\n`);
    return 0;
  } catch (error) {
    if (error instanceof AppError && error.status < 500) {
      process.stderr.write(`create-shop: ${error.message}\n`);
      return 2;
    }
    process.stderr.write(`create-shop: ${error instanceof Error ? error.message : String(error)}\n`);
    return 1;
  } finally {
    await sequelize.close();
    await db?.stop();
  }
}

if (/create-shop\.(ts|js)$/.test(process.argv[1] ?? '')) {
  main().then(
    (code) => process.exit(code),
    (error: unknown) => {
      process.stderr.write(`create-shop: ${error instanceof Error ? error.message : String(error)}\n`);
      process.exit(1);
    },
  );
}
