// The pretest step that finds Debian's Chromium: the missing-browser branch is tested by pointing
// CHROMIUM_PATH at a path that does not exist, with the apt-get step stubbed by
// CHROMIUM_INSTALL_COMMAND (never by removing the machine's package).
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ensureChromium } from '../../scripts/ensure-chromium';

const nowhere = path.resolve('tests/fixtures/no-such-dir/chromium');

describe('ensure-chromium (pretest)', { timeout: 90_000 }, () => {
  it('returns CHROMIUM_PATH when it names an executable', () => {
    expect(ensureChromium({ CHROMIUM_PATH: process.execPath }, false, () => {})).toBe(process.execPath);
  });

  it('runs the install step when the browser is missing, and stops with the command when it is still missing', () => {
    const logged: string[] = [];
    expect(() => ensureChromium({ CHROMIUM_PATH: nowhere, CHROMIUM_INSTALL_COMMAND: 'true' }, true, (m) => logged.push(m)))
      .toThrow(/install it with: apt-get install -y chromium/);
    expect(logged.join('\n')).toMatch(/installing Debian's chromium package/);
  });

  it('does not install when not root on a machine without a stubbed command, and names sudo', () => {
    const logged: string[] = [];
    expect(() => ensureChromium({ CHROMIUM_PATH: nowhere }, false, (m) => logged.push(m)))
      .toThrow(/sudo apt-get install -y chromium/);
    expect(logged).toEqual([]);
  });

  it('npm test stops before running any test, with one line naming the command', () => {
    const run = spawnSync('npm', ['test', '--silent'], {
      encoding: 'utf8', timeout: 80_000,
      env: { ...process.env, CHROMIUM_PATH: nowhere, CHROMIUM_INSTALL_COMMAND: 'true' },
    });
    expect(run.status).not.toBe(0);
    const errorLines = run.stderr.trim().split('\n').filter((l) => l.startsWith('Chromium'));
    expect(errorLines).toHaveLength(1);
    expect(errorLines[0]).toMatch(/apt-get install -y chromium/);
    expect(run.stdout).not.toMatch(/vite|RUN|Tests:/);
  });
});
