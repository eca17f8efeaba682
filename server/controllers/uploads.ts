import type { RequestHandler } from 'express';
import { uploadFieldsSchema } from '@shared/rider';
import { badRequest, notFound } from '../errors';
import { fieldErrors, parseId } from '../middleware/validate';
import { presentUpload } from '../presenters/intake';
import { actorFromRequest } from '../services/audit';
import { createUpload, deleteOwnUpload, listOwnUploads, readUploadFile } from '../services/uploads';
import type { AppContext } from '../context';

function uploadId(raw: unknown): number {
  const id = parseId(typeof raw === 'string' ? raw : undefined);
  if (!id) throw notFound('That file');
  return id;
}

export function createUploadsController(ctx: AppContext) {
  const create: RequestHandler = async (req, res) => {
    const file = req.file;
    if (!file) throw badRequest('Choose a photo or clip to upload.', { file: 'Choose a photo or clip to upload.' });
    // Multer's body has no prototype; copy it so the schema sees a plain object.
    const fields = uploadFieldsSchema.safeParse({ ...(req.body as object) });
    if (!fields.success) {
      const messages = fieldErrors(fields.error);
      throw badRequest(Object.values(messages).join(' '), messages);
    }
    const { view } = fields.data;
    const upload = await createUpload(ctx, req.user!.id, { buffer: file.buffer, size: file.size }, view, actorFromRequest(req));
    res.status(201).json({ upload: presentUpload(upload) });
  };

  const list: RequestHandler = async (req, res) => {
    res.json({ uploads: (await listOwnUploads(req.user!.id, actorFromRequest(req))).map(presentUpload) });
  };

  const remove: RequestHandler = async (req, res) => {
    await deleteOwnUpload(ctx, req.user!.id, uploadId(req.params.id), actorFromRequest(req));
    res.status(204).end();
  };

  /** Private, never sniffed, shown inline; range requests work for clips (res.sendFile). */
  const serve = (variant: 'file' | 'thumbnail'): RequestHandler => async (req, res, next) => {
    const file = await readUploadFile(ctx, req.user!, uploadId(req.params.id), variant, actorFromRequest(req));
    res.setHeader('Content-Type', file.contentType);
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Content-Disposition', `inline; filename="${file.downloadName}"`);
    res.setHeader('Cache-Control', 'private, max-age=300');
    res.sendFile(file.name, { root: file.root, cacheControl: false, dotfiles: 'deny' }, (error) => {
      if (error && !res.headersSent) next(notFound('That file'));
    });
  };

  return { create, list, remove, serveFile: serve('file'), serveThumbnail: serve('thumbnail') };
}
