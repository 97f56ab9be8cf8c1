// `npm run create-shop` end to end: the real script (through tsx) against the test database.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { Shop, User } from '../../../server/models';
import { projectRoot } from '../../../server/paths';
import { parseCreateShopArgs } from '../../../scripts/create-shop';
import { seedDemoShop, DEMO_SHOP_NAME } from '../../../server/services/demo-shop';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { uniq } from '../../helpers/factories';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
  await seedDemoShop(t.sequelize, 4);
});
afterAll(async () => t.close());

function createShopCli(args: string[]) {
  const root = projectRoot();
  const run = spawnSync(process.execPath, [join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs'), join(root, 'scripts', 'create-shop.ts'), ...args], {
    cwd: root,
    env: { ...process.env, DATABASE_URL: inject('databaseUrl'), BCRYPT_ROUNDS: '4', LOG_LEVEL: 'silent' },
    encoding: 'utf8',
    timeout: 60_000,
  });
  return { code: run.status, stdout: run.stdout, stderr: run.stderr };
}

describe('npm run create-shop', () => {
  it("makes a shop whose admin signs in with the generated password and sees nothing of the demo shop", async () => {
    const email = `owner.${uniq()}@example.test`;
    const name = `Birchfield Motor Works ${uniq()}`;
    const run = createShopCli(['--name', name, '--admin-email', email, '--admin-name', 'Ola Brandt']);
    expect(run.code, run.stderr).toBe(0);
    const password = /Generated password[^:]*: (\S+)/.exec(run.stdout)?.[1];
    expect(password).toBeDefined();

    const admin = await t.signIn(email, password!);
    const me = (await admin.get('/api/auth/me')).body.user;
    expect(me).toMatchObject({ email, name: 'Ola Brandt', role: 'admin', shop: { name, isDemo: false } });
    const users = (await admin.get('/api/users')).body.items;
    expect(users.map((u: { email: string }) => u.email)).toEqual([email]);
    expect(JSON.stringify(users)).not.toContain(DEMO_SHOP_NAME);
    expect((await admin.get('/api/outbox')).body.items).toEqual([]);
    expect((await admin.get('/api/invites')).body.items).toEqual([]);
    const demoAdmin = await User.findOne({ where: { email: 'adam.admin@demo.crankwise.test' } });
    expect((await admin.patch(`/api/users/${demoAdmin!.id}`, { name: 'Taken Over' })).status).toBe(404);
  });

  it('exits 2 with one line naming the missing option, and writes nothing', async () => {
    const before = await Shop.count();
    const run = createShopCli(['--name', 'Only A Name']);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/--admin-email is required/);
    expect(await Shop.count()).toBe(before);
  });

  it('names the bad option for each kind of bad input', () => {
    const cases: Array<[string[], RegExp]> = [
      [['--name', 'Bad Mail Garage', '--admin-email', 'not-an-address'], /^--admin-email: /],
      [['--name', 'Short Pw Garage', '--admin-email', 'x@example.test', '--password', 'short'], /^--password: /],
      [['--name', 'X', '--admin-email', 'x@example.test'], /^--name: /],
      [['--name', 'Typo Garage', '--admin-mail', 'a@b.test'], /admin-mail/],
      [['--name', 'Stray Garage', '--admin-email', 'a@b.test', 'extra'], /extra/],
    ];
    for (const [args, pattern] of cases) {
      expect(() => parseCreateShopArgs(args), args.join(' ')).toThrow(pattern);
    }
    expect(parseCreateShopArgs(['--name', ' Good Garage ', '--admin-email', 'A@B.test'])).toEqual({
      name: 'Good Garage',
      adminEmail: 'a@b.test',
      adminName: 'Shop admin',
    });
  });

  it('exits 2 when the admin e-mail already has an account, leaving no half-made shop', async () => {
    const name = `Duplicate Admin Garage ${uniq()}`;
    const run = createShopCli(['--name', name, '--admin-email', 'adam.admin@demo.crankwise.test', '--password', 'long-enough-password']);
    expect(run.code, run.stderr).toBe(2);
    expect(run.stderr).toMatch(/already has a Crankwise account/);
    expect(await Shop.count({ where: { name } })).toBe(0);
  });
});
