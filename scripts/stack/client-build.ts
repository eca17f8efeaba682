import fs from 'node:fs';
import path from 'node:path';

const CLIENT_INPUTS = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'package-lock.json', 'tsconfig.json'];

function newestMtime(target: string): number {
  if (!fs.existsSync(target)) return 0;
  const stat = fs.statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of fs.readdirSync(target)) newest = Math.max(newest, newestMtime(path.join(target, entry)));
  return newest;
}

/** Build the client with Vite unless dist/ is newer than every input. */
export async function buildClientIfStale(root: string, log: (line: string) => void): Promise<void> {
  const stamp = path.join(root, 'dist', '.built-at');
  const inputs = Math.max(...CLIENT_INPUTS.map((p) => newestMtime(path.join(root, p))));
  if (fs.existsSync(stamp) && fs.statSync(stamp).mtimeMs > inputs) {
    log('Client build is up to date.');
    return;
  }
  log('Building the client…');
  const { build } = await import('vite');
  await build({ root, logLevel: 'warn', configFile: path.join(root, 'vite.config.ts') });
  fs.writeFileSync(stamp, new Date().toISOString());
}
