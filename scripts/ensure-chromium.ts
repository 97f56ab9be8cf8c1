// `npm test`'s pretest step: the browser tests drive Debian's Chromium, so find it before any test
// runs, as scripts/db.ts finds MariaDB. CHROMIUM_PATH (default /usr/bin/chromium) names the binary.
// When it is missing and we run as root on Debian, install the `chromium` package with apt-get;
// otherwise stop with one line naming the command to run. Never downloads a browser.
// CHROMIUM_INSTALL_COMMAND replaces the apt-get step (tests stub it with `true`), and
// CHROMIUM_INSTALL=off skips the install altogether.
import { spawnSync } from 'node:child_process';
import { accessSync, constants, existsSync } from 'node:fs';
import { pathToFileURL } from 'node:url';

/** The default browser path: Debian's chromium package. */
export const DEFAULT_CHROMIUM_PATH = '/usr/bin/chromium';
const APT_INSTALL = 'apt-get update && apt-get install -y --no-install-recommends chromium';

/** What ensureChromium needs to know about the machine; tests pass their own. */
export interface ChromiumEnv {
  CHROMIUM_PATH?: string;
  CHROMIUM_INSTALL?: string;
  CHROMIUM_INSTALL_COMMAND?: string;
}

/** Whether a file exists and may be executed. */
export function isExecutable(file: string): boolean {
  try {
    accessSync(file, constants.X_OK);
    return true;
  } catch {
    return false;
  }
}

/**
 * Returns the browser's path, installing Debian's chromium when it is missing and allowed; throws an
 * Error whose message is the one line to show (with the command to run) when there is no browser.
 */
export function ensureChromium(env: ChromiumEnv, isRoot: boolean, log: (m: string) => void): string {
  const browser = env.CHROMIUM_PATH || DEFAULT_CHROMIUM_PATH;
  if (isExecutable(browser)) return browser;
  const canInstall = env.CHROMIUM_INSTALL !== 'off'
    && (env.CHROMIUM_INSTALL_COMMAND !== undefined || (isRoot && existsSync('/etc/debian_version')));
  const command = env.CHROMIUM_INSTALL_COMMAND ?? APT_INSTALL;
  if (canInstall) {
    log(`Chromium not found at ${browser}: installing Debian's chromium package (once)`);
    const run = spawnSync('sh', ['-c', command], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
    if (run.status === 0 && isExecutable(browser)) return browser;
  }
  const sudo = isRoot ? '' : 'sudo ';
  throw new Error(`Chromium for the browser tests is not at ${browser}; install it with: ${sudo}apt-get install -y chromium `
    + '(or set CHROMIUM_PATH to its binary)');
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  try {
    ensureChromium(process.env, process.getuid?.() === 0, (m) => console.log(m));
  } catch (error) {
    console.error((error as Error).message);
    process.exit(1);
  }
}
