import { z } from 'zod';
import {
  bikeViewSchema, profileViewSchema, snapshotViewSchema,
  type BikeCreateInput, type ProfileInput, type SnapshotInput,
} from '@shared/rider';
import type { LengthUnit } from '@shared/units';
import { http } from './http';

const profileEnvelope = z.object({ profile: profileViewSchema });
const bikeEnvelope = z.object({ bike: bikeViewSchema });
const bikeDetail = z.object({ bike: bikeViewSchema, snapshots: z.array(snapshotViewSchema) });

/** "About me · My bikes": the profile, bikes and their setup history. Lengths come back in mm. */
export const riderApi = {
  profile: async () => (await http.get('/api/rider/profile', profileEnvelope)).profile,
  saveProfile: async (input: ProfileInput) => (await http.put('/api/rider/profile', input, profileEnvelope)).profile,
  saveUnit: async (unit: LengthUnit) => (await http.put('/api/rider/unit-preference', { unit }, z.object({ unit: z.enum(['mm', 'in']) }))).unit,

  bikes: async () => (await http.get('/api/rider/bikes', z.object({ bikes: z.array(bikeViewSchema) }))).bikes,
  createBike: async (input: BikeCreateInput) => (await http.post('/api/rider/bikes', input, bikeEnvelope)).bike,
  bike: (id: number) => http.get(`/api/rider/bikes/${id}`, bikeDetail),
  renameBike: async (id: number, name: string) => (await http.patch(`/api/rider/bikes/${id}`, { name }, bikeEnvelope)).bike,
  retireBike: (id: number) => http.deleteEmpty(`/api/rider/bikes/${id}`),
  addSnapshot: async (id: number, input: SnapshotInput) => (await http.post(`/api/rider/bikes/${id}/snapshots`, input, z.object({ snapshot: snapshotViewSchema }))).snapshot,
};
