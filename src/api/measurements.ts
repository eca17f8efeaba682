import { z } from 'zod';
import { photoMeasurementInputSchema, photoMeasurementSchema, type PhotoMeasurementInput } from '@shared/fit/photo';
import { http } from './http';

const measurementSchema = z.object({
  id: z.number(),
  uploadId: z.number(),
  input: photoMeasurementInputSchema,
  result: photoMeasurementSchema,
  createdAt: z.string(),
  createdBy: z.union([z.number(), z.object({ id: z.number(), displayName: z.string() })]),
});
export type StoredMeasurement = z.infer<typeof measurementSchema>;

/** Points marked on a photo; the server recomputes the result with the same shared code. */
export const measurementsApi = {
  async list(uploadId: number, consultationId: number): Promise<StoredMeasurement[]> {
    return (await http.get(`/api/uploads/${uploadId}/measurements?consultationId=${consultationId}`, z.object({ measurements: z.array(measurementSchema) }))).measurements;
  },
  async save(uploadId: number, consultationId: number, input: PhotoMeasurementInput): Promise<StoredMeasurement> {
    return (await http.post(`/api/uploads/${uploadId}/measurements`, { consultationId, input }, z.object({ measurement: measurementSchema }))).measurement;
  },
};
