import { ref, shallowRef } from 'vue';
import { defineStore } from 'pinia';
import type { ClinicSettings, ClinicSettingsInput } from '@shared/clinic';
import { adminApi, type HardBounds } from '@/api/admin';
import { asApiError, type ApiError } from '@/api/http';

/**
 * The clinic's settings as the admin last loaded or saved them, with the hard safety bounds the
 * server enforces. One copy for the Clinic screen, so switching tabs does not lose a fresh save.
 */
export const useClinicStore = defineStore('clinic', () => {
  const settings = shallowRef<ClinicSettings | null>(null);
  const hardBounds = shallowRef<HardBounds | null>(null);
  const loading = ref(false);
  const error = ref<ApiError | null>(null);

  async function load(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      const page = await adminApi.settings();
      settings.value = page.settings;
      hardBounds.value = page.hardBounds;
    } catch (caught) {
      error.value = asApiError(caught);
    } finally {
      loading.value = false;
    }
  }

  /** Stores what the server kept (it may normalise), and returns it. Throws the ApiError of a refusal. */
  async function save(input: ClinicSettingsInput): Promise<ClinicSettings> {
    settings.value = await adminApi.saveSettings(input);
    return settings.value;
  }

  return { settings, hardBounds, loading, error, load, save };
});
