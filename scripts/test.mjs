// `npm test`: the same pre-step as `npm start` (plus Chromium for the browser tests), then the
// test stack. Extra arguments go to vitest, e.g. `npm test -- tests/server/auth.test.ts`.
import path from 'node:path';
import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { CHROMIUM, MARIADB, ensureNodeModules, ensureSystemPackages } from './prestep.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
try {
  ensureSystemPackages([MARIADB, CHROMIUM]);
  ensureNodeModules(root);
} catch (error) {
  console.error(`[saddlestep] ${error.message}`);
  process.exit(1);
}
const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'scripts/stack/test.ts'), ...process.argv.slice(2)], { cwd: root, stdio: 'inherit' });
for (const signal of ['SIGTERM', 'SIGHUP']) process.on(signal, () => child.kill(signal));
process.on('SIGINT', () => {});
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
