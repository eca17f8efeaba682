// The pre-step of `npm start` and `npm test`, written with Node built-ins only because it runs
// before any npm package may exist: install missing system packages through apt and the npm
// packages when node_modules is absent or older than package-lock.json.
import { execFileSync, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

const log = (line) => console.log(`[saddlestep] ${line}`);

function commandExists(file) {
  return fs.existsSync(file);
}

function runAsRoot(args) {
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  const [cmd, ...rest] = isRoot ? args : ['sudo', '-n', ...args];
  const result = spawnSync(cmd, rest, { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  return result.status === 0;
}

/** apt packages keyed by the file that proves they are installed. */
export function ensureSystemPackages(packages) {
  const missing = packages.filter((pkg) => !pkg.provides.some(commandExists)).map((pkg) => pkg.name);
  if (missing.length === 0) return;
  log(`Installing system packages with apt: ${missing.join(', ')} (one time)…`);
  // Try without refreshing the lists first; a fresh machine may need `apt-get update`.
  const install = () => runAsRoot(['apt-get', 'install', '-y', '-q', '--no-install-recommends', ...missing]);
  if (!install()) {
    runAsRoot(['apt-get', 'update', '-q']);
    if (!install()) {
      throw new Error(`apt could not install ${missing.join(', ')}. Install them by hand (sudo apt-get install ${missing.join(' ')}) and try again.`);
    }
  }
}

/** Reinstall npm packages when the lock file changed since the last install (or none ran). */
export function ensureNodeModules(root) {
  const lockFile = path.join(root, 'package-lock.json');
  const stampFile = path.join(root, 'node_modules', '.saddlestep-lock-hash');
  const wanted = createHash('sha256').update(fs.readFileSync(lockFile)).digest('hex');
  const have = fs.existsSync(stampFile) ? fs.readFileSync(stampFile, 'utf8').trim() : null;
  if (have === wanted) return;
  log(fs.existsSync(path.join(root, 'node_modules')) ? 'package-lock.json changed; updating npm packages…' : 'Installing npm packages (one time)…');
  execFileSync('npm', ['ci', '--no-audit', '--no-fund', '--loglevel=error'], { cwd: root, stdio: 'inherit' });
  fs.writeFileSync(stampFile, wanted);
}

export const MARIADB = { name: 'mariadb-server', provides: ['/usr/sbin/mariadbd', '/usr/sbin/mysqld'] };
export const CHROMIUM = { name: 'chromium', provides: ['/usr/bin/chromium'] };

