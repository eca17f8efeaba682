import { computed, ref, shallowRef } from 'vue';
import { defineStore } from 'pinia';
import type { PhotoMeasurement } from '@shared/fit/photo';
import { casesApi, type CaseFile } from '@/api/cases';
import { measurementsApi } from '@/api/measurements';
import { asApiError, type ApiError } from '@/api/http';

/**
 * The fitter's workspace for one consultation: the case (intake, profile, bikes, photos), the bike
 * being worked on, and the latest knee angle measured on a photo, shared by the workspace tabs so
 * each does not fetch or ask again.
 */
export const useWorkspaceStore = defineStore('workspace', () => {
  const consultationId = ref<number | null>(null);
  const caseFile = shallowRef<CaseFile | null>(null);
  const error = ref<ApiError | null>(null);
  const loading = ref(false);
  const chosenBikeId = ref<number | null>(null);
  /** Static knee flexion from the last photo measurement, degrees (feeds the estimates). */
  const measuredKneeFlexion = ref<number | null>(null);
  /** Thigh and shank lengths from a photo with a scale, mm (feed the knee-angle model). */
  const measuredLeg = ref<{ thigh: number; shank: number } | null>(null);

  const bike = computed(() => {
    const bikes = caseFile.value?.bikes ?? [];
    return bikes.find((b) => b.id === chosenBikeId.value) ?? bikes.find((b) => b.currentSetup !== null) ?? bikes[0] ?? null;
  });
  const inseamMm = computed(() => caseFile.value?.rider?.profile?.inseamMm ?? null);

  async function load(id: number, force = false): Promise<void> {
    if (!force && consultationId.value === id && caseFile.value) return;
    if (consultationId.value !== id) {
      caseFile.value = null;
      chosenBikeId.value = null;
      measuredKneeFlexion.value = null;
      measuredLeg.value = null;
    }
    consultationId.value = id;
    loading.value = true;
    error.value = null;
    try {
      const loaded = await casesApi.show(id);
      if (consultationId.value === id) caseFile.value = loaded;
    } catch (caught) {
      if (consultationId.value === id) error.value = asApiError(caught);
    } finally {
      loading.value = false;
    }
  }

  function chooseBike(id: number): void {
    chosenBikeId.value = id;
  }

  /** Keep what a photo measurement found, for the estimates tab. */
  function noteMeasurement(result: PhotoMeasurement): void {
    if (result.kneeFlexion) measuredKneeFlexion.value = Math.round(result.kneeFlexion.value * 10) / 10;
    if (result.thighMm && result.shankMm) measuredLeg.value = { thigh: Math.round(result.thighMm.value), shank: Math.round(result.shankMm.value) };
  }

  /** The newest saved measurement of this case's photos, unless this visit already has one. */
  async function loadLatestMeasurement(): Promise<void> {
    const id = consultationId.value;
    const measured = (caseFile.value?.uploads ?? []).filter((u) => u.measured);
    if (id === null || measured.length === 0 || measuredKneeFlexion.value !== null) return;
    try {
      const lists = await Promise.all(measured.map((u) => measurementsApi.list(u.id, id)));
      const latest = lists.flat().sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.id - b.id).pop();
      if (latest && consultationId.value === id) noteMeasurement(latest.result);
    } catch {
      // The estimates work without it; the fitter can type the numbers.
    }
  }

  return { loadLatestMeasurement, consultationId, caseFile, error, loading, bike, inseamMm, measuredKneeFlexion, measuredLeg, load, chooseBike, noteMeasurement };
});
