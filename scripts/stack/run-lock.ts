import fs from 'node:fs';
import { isProcessAlive } from './net';

export interface RunRecord {
  pid: number;
  url: string;
  startedAt: string;
}

/**
 * One `npm start` per project folder. The lock file is created atomically (`wx`), so two starts
 * racing each other cannot both win; a lock left by a crashed run (its pid is gone) is taken over.
 */
export function acquireRunLock(file: string, record: RunRecord): { ok: true; release: () => void } | { ok: false; holder: RunRecord } {
  for (let attempt = 0; attempt < 2; attempt += 1) {
    try {
      fs.writeFileSync(file, JSON.stringify(record), { flag: 'wx' });
      return {
        ok: true,
        release: () => {
          try {
            const current = JSON.parse(fs.readFileSync(file, 'utf8')) as RunRecord;
            if (current.pid === record.pid) fs.rmSync(file, { force: true });
          } catch {
            /* already gone */
          }
        },
      };
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
      let holder: RunRecord | null = null;
      try {
        holder = JSON.parse(fs.readFileSync(file, 'utf8')) as RunRecord;
      } catch {
        holder = null; // half-written by a crash: treat as stale
      }
      if (holder && holder.pid !== record.pid && isProcessAlive(holder.pid)) return { ok: false, holder };
      fs.rmSync(file, { force: true });
    }
  }
  throw new Error(`Could not take the run lock ${file}; remove it if no Saddlestep is running.`);
}
