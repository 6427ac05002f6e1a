// What the machine must have: Debian packages (installed with apt when missing, as root)
// and the npm dependencies (installed with `npm ci` when missing or stale).
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { hasCommand, mustRun } from './run.mjs';
import { fail, info, step } from './log.mjs';

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
let aptUpdated = false;

/**
 * Installs the Debian packages whose command is missing. `wanted` maps a command to the
 * package that provides it; `why` explains, for the message shown without root.
 */
export async function ensureDebianPackages(wanted, why) {
  const missing = Object.entries(wanted).filter(([command]) => !hasCommand(command));
  if (missing.length === 0) return;
  const packages = [...new Set(missing.map(([, pkg]) => pkg))];
  const sudo = !isRoot && hasCommand('sudo') ? ['sudo', '-n'] : [];
  if (!isRoot && sudo.length === 0) {
    fail(
      `${why} needs the Debian package(s) ${packages.join(', ')}, and this user cannot install them.\n` +
        `  Install them with: sudo apt-get install -y ${packages.join(' ')}\n` +
        `  or point DATABASE_URL at an existing MariaDB server.`,
    );
  }
  if (!hasCommand('apt-get')) {
    fail(`${why} needs ${packages.join(', ')}; this machine has no apt-get. Install them by hand, or set DATABASE_URL.`);
  }
  step(`Installing ${packages.join(', ')} with apt (${why})`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const apt = (args) => (sudo.length ? ['sudo', ['-n', 'apt-get', ...args]] : ['apt-get', args]);
  if (!aptUpdated) {
    const [cmd, args] = apt(['-o', 'DPkg::Lock::Timeout=600', 'update', '-qq']);
    await mustRun('apt-get update', cmd, args, { env });
    aptUpdated = true;
  }
  const [cmd, args] = apt(['-o', 'DPkg::Lock::Timeout=600', 'install', '-y', '-qq', '--no-install-recommends', ...packages]);
  await mustRun(`apt-get install ${packages.join(' ')}`, cmd, args, { env });
  const still = missing.filter(([command]) => !hasCommand(command)).map(([command]) => command);
  if (still.length) fail(`After installing ${packages.join(', ')}, still missing: ${still.join(', ')}.`);
}

/** Runs `npm ci` when node_modules is missing or older than package-lock.json. */
export async function ensureNodeModules(root) {
  const lock = path.join(root, 'package-lock.json');
  const stamp = path.join(root, 'node_modules', '.rolloff-lock-hash');
  const hash = createHash('sha256').update(readFileSync(lock)).digest('hex');
  if (existsSync(stamp) && readFileSync(stamp, 'utf8') === hash) return;
  step('Installing npm packages (npm ci)');
  await mustRun('npm ci', 'npm', ['ci', '--no-audit', '--no-fund'], { cwd: root });
  writeFileSync(stamp, hash);
  info('npm packages installed');
}
