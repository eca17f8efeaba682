import { randomUUID } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import type { Config } from '../config';

/**
 * Files live in UPLOAD_DIR, outside the web root, under random names that carry nothing of the
 * original (no rider id, no date, no file name). Only the uploads table maps a name to a rider.
 */
export function uploadDir(config: Pick<Config, 'UPLOAD_DIR'>): string {
  return path.resolve(config.UPLOAD_DIR);
}

const NAME = /^[0-9a-f-]{36}(\.thumb)?\.(jpg|png|webp|mp4|webm)$/;

/** The absolute path of a stored file; refuses anything that is not one of our own names. */
export function storedPath(config: Pick<Config, 'UPLOAD_DIR'>, name: string): string {
  if (!NAME.test(name)) throw new Error('not a stored upload name');
  return path.join(uploadDir(config), name);
}

/** Write a new file with a random name; created exclusively and readable by the server only. */
export async function writeStoredFile(config: Pick<Config, 'UPLOAD_DIR'>, data: Buffer, ext: string, suffix = ''): Promise<string> {
  await fs.mkdir(uploadDir(config), { recursive: true, mode: 0o700 });
  const name = `${randomUUID()}${suffix}.${ext}`;
  await fs.writeFile(storedPath(config, name), data, { flag: 'wx', mode: 0o600 });
  return name;
}

/** Best-effort removal; a file already gone is fine. */
export async function removeStoredFiles(config: Pick<Config, 'UPLOAD_DIR'>, names: string[]): Promise<void> {
  await Promise.all(names.map((name) => fs.rm(storedPath(config, name), { force: true })));
}
