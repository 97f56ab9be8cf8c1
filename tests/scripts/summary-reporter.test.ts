// The closing line CI reads must count every kind of failure: a tiny fixture project
// (tests/fixtures/reporter-project) run by a child vitest with the project's summary reporter.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const config = path.resolve('tests/fixtures/reporter-project/vitest.config.ts');
const vitest = path.resolve('node_modules/vitest/vitest.mjs');

function runFixture(filter: string): { lines: string[]; status: number | null } {
  const run = spawnSync(process.execPath, [vitest, 'run', '--config', config, filter], {
    encoding: 'utf8', timeout: 80_000, env: { ...process.env, VITEST: undefined, NODE_ENV: 'test' },
  });
  return { lines: run.stdout.trim().split('\n'), status: run.status };
}

// Each test starts a child vitest or npm: allow for a loaded machine.
describe('summary reporter', { timeout: 90_000 }, () => {
  it('counts a file whose beforeAll throws as one failed file and exits non-zero', () => {
    const { lines, status } = runFixture('before-all-throws');
    expect(lines.at(-2)).toBe('Failed: 0 tests, 1 files, 0 errors');
    expect(lines.at(-1)).toBe('Tests: 0 passed, 1 failed, 1 skipped');
    expect(status).not.toBe(0);
  });

  it('counts a file that fails to import as a failed file', () => {
    const { lines, status } = runFixture('import-error');
    expect(lines.at(-2)).toBe('Failed: 0 tests, 1 files, 0 errors');
    expect(lines.at(-1)).toBe('Tests: 0 passed, 1 failed, 0 skipped');
    expect(status).not.toBe(0);
  });

  it("counts vitest's unhandled errors even when every test passed", () => {
    const { lines, status } = runFixture('unhandled-error');
    expect(lines.at(-2)).toBe('Failed: 0 tests, 0 files, 1 errors');
    expect(lines.at(-1)).toBe('Tests: 1 passed, 1 failed, 0 skipped');
    expect(status).not.toBe(0);
  });

  it('reads 0 failed and exits 0 on a green run', () => {
    const { lines, status } = runFixture('passes');
    expect(lines.at(-1)).toBe('Tests: 1 passed, 0 failed, 0 skipped');
    expect(status).toBe(0);
  });
});
