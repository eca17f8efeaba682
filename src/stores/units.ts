import { ref } from 'vue';
import { defineStore } from 'pinia';
import type { LengthUnit } from '@shared/units';
import { riderApi } from '@/api/rider';

/** The rider's display unit (mm or inches). Storage is always millimetres; this is only how numbers show. */
export const useUnitsStore = defineStore('units', () => {
  const unit = ref<LengthUnit>('mm');
  const loaded = ref(false);

  /** Take the unit from a profile the page already loaded, so it is not fetched twice. */
  function adopt(value: LengthUnit): void {
    unit.value = value;
    loaded.value = true;
  }

  async function ensureLoaded(): Promise<void> {
    if (loaded.value) return;
    adopt((await riderApi.profile()).unit);
  }

  /** Switch at once on screen, then remember it; a failed save leaves the screen as chosen. */
  async function choose(value: LengthUnit): Promise<void> {
    unit.value = value;
    loaded.value = true;
    await riderApi.saveUnit(value);
  }

  return { unit, loaded, adopt, ensureLoaded, choose };
});
