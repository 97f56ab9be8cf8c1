// Tests and code read only the checkout: no tracked file names a home, work or temp folder of one
// machine in a string (system paths such as /usr/bin/chromium are fine).
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const MACHINE_FOLDER = /['"`]\/(work|home|tmp)\//;

describe('tracked files', () => {
  it('name no machine folder (/work/, /home/, /tmp/) in a string', () => {
    const files = execFileSync('git', ['ls-files', '-z'], { encoding: 'utf8' }).split('\0').filter(Boolean);
    expect(files.length).toBeGreaterThan(100);
    const offenders = files.filter((file) => {
      let text: string;
      try {
        text = readFileSync(file, 'utf8');
      } catch {
        return false; // listed but deleted in the work tree
      }
      return !text.includes('\0') && MACHINE_FOLDER.test(text);
    });
    expect(offenders).toEqual([]);
  });

  it('the pattern catches a machine folder and lets a system path through', () => {
    // Built from parts, so this file itself does not hold the pattern it refuses.
    const quote = "'";
    expect(MACHINE_FOLDER.test(`readFileSync(${quote}/${'work'}/shared/x.csv${quote})`)).toBe(true);
    expect(MACHINE_FOLDER.test(`const dir = "/${'tmp'}/crankwise"`)).toBe(true);
    expect(MACHINE_FOLDER.test("executablePath: '/usr/bin/chromium'")).toBe(false);
  });
});
