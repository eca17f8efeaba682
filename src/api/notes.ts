import { z } from 'zod';
import { http } from './http';

const noteSchema = z.object({ id: z.number(), body: z.string(), createdAt: z.string(), updatedAt: z.string() });
export type FitterNote = z.infer<typeof noteSchema>;

/** The fitter's private notes on a consultation. Only the fitter's own screens ever call these. */
export const notesApi = {
  async list(consultationId: number): Promise<FitterNote[]> {
    return (await http.get(`/api/consultations/${consultationId}/notes`, z.object({ notes: z.array(noteSchema) }))).notes;
  },
  async add(consultationId: number, body: string): Promise<FitterNote> {
    return (await http.post(`/api/consultations/${consultationId}/notes`, { body }, z.object({ note: noteSchema }))).note;
  },
};
