import type { RequestHandler } from 'express';
import fs from 'node:fs';
import archiver from 'archiver';
import type { z } from 'zod';
import type { deleteAccountSchema } from '@shared/admin';
import { Upload } from '../models';
import type { AppContext } from '../context';
import type { PasswordHasher } from '../services/passwords';
import { actorFromRequest, recordAudit } from '../services/audit';
import { archiveName, collectRiderData } from '../services/data-export';
import { deleteRiderAccount } from '../services/account-deletion';
import { storedPath } from '../services/upload-storage';
import { disconnectUser } from '../socket/evict';

export function createPrivacyController(ctx: AppContext, hasher: PasswordHasher) {
  /** A zip with data.json and every photo and clip, streamed so large exports use little memory. */
  const exportData: RequestHandler = async (req, res) => {
    const rider = req.user!;
    const data = await collectRiderData(rider.id);
    const uploads = await Upload.findAll({ where: { riderId: rider.id } });
    await recordAudit(actorFromRequest(req), { action: 'account.export', subjectType: 'user', subjectId: rider.id, subjectUserId: rider.id });
    const archive = archiver('zip', { zlib: { level: 6 } });
    archive.on('error', (error) => {
      ctx.logger.error({ err: error }, 'export archive failed');
      res.destroy(error);
    });
    res.attachment(`saddlestep-export-${new Date().toISOString().slice(0, 10)}.zip`);
    res.setHeader('Cache-Control', 'no-store');
    archive.pipe(res);
    archive.append(JSON.stringify(data, null, 2), { name: 'data.json' });
    for (const upload of uploads) {
      const file = storedPath(ctx.config, upload.storageName);
      if (fs.existsSync(file)) archive.file(file, { name: archiveName(upload) });
    }
    await archive.finalize();
  };

  const deleteAccount: RequestHandler = async (req, res) => {
    const { password } = req.body as z.output<typeof deleteAccountSchema>;
    await deleteRiderAccount(ctx, req.user!, password, hasher, actorFromRequest(req));
    disconnectUser(ctx.io, req.user!.id);
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    res.clearCookie('saddlestep.sid');
    res.status(204).end();
  };

  return { exportData, deleteAccount };
}
