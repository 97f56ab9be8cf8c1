// Walks EVERY row of the route access table: a signed-out visitor gets 401 unless the row is public,
// each role the row does not list gets 403, and on rows naming a shop-owned id every allowed role
// gets 404 for another shop's record. New rows are covered as soon as they are added.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isAllowed } from '../../../shared/auth/access';
import { ROLES, type Role } from '../../../shared/auth/roles';
import { routeTable } from '../../../server/routes/route-table';
import type { RouteRow } from '../../../server/routes/route-row';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, ownedFactories, type TestShop } from '../../helpers/factories';

let t: TestApp;
let mine: TestShop;
let theirs: TestShop;
const agents = {} as Record<Role, ApiAgent>;

beforeAll(async () => {
  t = await createTestApp();
  mine = await createTestShop();
  theirs = await createTestShop();
  for (const role of ROLES) agents[role] = await t.signIn(mine.users[role].email, mine.users[role].password);
});
afterAll(async () => t.close());

/** The row's path with every parameter filled: the owned one with `ownedId`, others with a dummy token. */
function fill(row: RouteRow, ownedId: number): string {
  return `/api${row.path}`.replace(/:(\w+)/g, (_m, name: string) =>
    name === row.ownedParam ? String(ownedId) : 'A'.repeat(43),
  );
}

// A signed-out visitor gets a fresh agent (and CSRF token) per call: sign-out ends the session a token is bound to.
const call = (agent: ApiAgent, row: RouteRow, path: string) =>
  row.method === 'get' ? agent.get(path) : agent.send(row.method, path, {});

const label = (row: RouteRow) => `${row.method.toUpperCase()} /api${row.path}`;

describe('route access table', () => {
  it('has unique method + path rows, and every shop-owned row names a parameter of its path', () => {
    const keys = routeTable.map((r) => `${r.method} ${r.path}`);
    expect(new Set(keys).size).toBe(keys.length);
    for (const row of routeTable.filter((r) => r.ownedParam)) {
      expect(row.path, label(row)).toContain(`:${row.ownedParam}`);
      expect(row.roles, label(row)).not.toBe('public');
    }
  });

  for (const row of routeTable) {
    describe(label(row), () => {
      if (row.roles === 'public') {
        it('is open to a signed-out visitor (never 401/403)', async () => {
          const res = await call(await t.agent(), row, fill(row, 1));
          expect([401, 403]).not.toContain(res.status);
        });
        return;
      }

      it('requires authentication (401 unauthenticated when signed out)', async () => {
        const res = await call(await t.agent(), row, fill(row, 1));
        expect(res.status).toBe(401);
        expect(res.body.error.code).toBe('unauthenticated');
      });

      for (const role of ROLES) {
        if (isAllowed(row.roles, role)) continue;
        it(`refuses ${role} with 403 forbidden`, async () => {
          const res = await call(agents[role], row, fill(row, 1));
          expect(res.status).toBe(403);
          expect(res.body.error.code).toBe('forbidden');
        });
      }

      if (row.ownedParam !== undefined) {
        const resource = row.resource;
        it(`answers 404 for another shop's ${resource} to every allowed role`, async () => {
          const otherId = await ownedFactories[resource](theirs.shop);
          for (const role of ROLES.filter((r) => isAllowed(row.roles, r))) {
            const res = await call(agents[role], row, fill(row, otherId));
            expect(res.status, role).toBe(404);
            expect(res.body.error.code, role).toBe('not_found');
          }
        });
      }
    });
  }
});
