import { clinicSettingsSchema, DEFAULT_CLINIC_SETTINGS, type ClinicSettings as Settings } from '@shared/clinic';
import { ClinicSettings } from '../models';

/**
 * The clinic policy in force. A missing or (after a schema change) partly outdated row falls back
 * to the defaults field by field, so old rows never stop bookings.
 */
export async function getClinicSettings(): Promise<Settings> {
  const row = await ClinicSettings.findByPk(1);
  if (!row) return DEFAULT_CLINIC_SETTINGS;
  const parsed = clinicSettingsSchema.safeParse(row.settings);
  return parsed.success ? parsed.data : DEFAULT_CLINIC_SETTINGS;
}
