// `npm start` (and `npm run dev` with --dev): pre-step with Node built-ins, then the stack.
import path from 'node:path';
import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { MARIADB, ensureNodeModules, ensureSystemPackages } from './prestep.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
try {
  ensureSystemPackages(process.env.DATABASE_URL ? [] : [MARIADB]);
  ensureNodeModules(root);
} catch (error) {
  console.error(`[saddlestep] ${error.message}`);
  process.exit(1);
}

const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'scripts/stack/start.ts'), ...process.argv.slice(2)], { cwd: root, stdio: 'inherit' });
// Ctrl-C reaches the child through the terminal's process group; forward TERM/HUP ourselves.
for (const signal of ['SIGTERM', 'SIGHUP']) process.on(signal, () => child.kill(signal));
process.on('SIGINT', () => {});
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
