import { computed, reactive, ref } from 'vue';
import { checkInFormSchema, type CheckInFormInput } from '@shared/care';
import { RED_FLAG_QUESTIONS, type BodyRegion, type RedFlagId } from '@shared/fit/triage';
import { checkInsApi, type CheckInAnswer } from '@/api/check-ins';
import { asApiError, type ApiError } from '@/api/http';

/** The safety questions asked at every check-in: only those a "yes" to which means urgent care. */
export const URGENT_FLAG_IDS: RedFlagId[] = RED_FLAG_QUESTIONS.filter((q) => q.level === 'urgent').map((q) => q.id);

interface PainEntry {
  region: BodyRegion;
  pain: number | null;
}

/**
 * The check-in form: what the rider fills in, the shared schema's check before sending (with
 * one message per field), and the server's answer. The urgent safety questions must be
 * answered every time, yes or no.
 */
export function useCheckInForm() {
  const form = reactive({
    rides: null as number | null,
    hours: 0 as number | null,
    minutes: 0 as number | null,
    comfort: null as number | null,
    pains: [] as PainEntry[],
    numbness: null as boolean | null,
    note: '',
    redFlagAnswers: {} as Partial<Record<RedFlagId, boolean>>,
  });
  const errors = ref<Record<string, string>>({});
  const formError = ref<ApiError | null>(null);
  const submitting = ref(false);

  const selectedRegions = computed(() => form.pains.map((p) => p.region));

  function toggleRegion(region: BodyRegion): void {
    const at = form.pains.findIndex((p) => p.region === region);
    if (at >= 0) form.pains.splice(at, 1);
    else form.pains.push({ region, pain: null });
  }

  function answer(id: RedFlagId, value: boolean): void {
    form.redFlagAnswers[id] = value;
  }

  /** The body to send; hours and minutes become one number of minutes. */
  function body(): CheckInFormInput {
    return {
      rides: form.rides ?? Number.NaN,
      minutesRidden: (form.hours ?? 0) * 60 + (form.minutes ?? 0),
      comfort: form.comfort ?? Number.NaN,
      pains: form.pains.map((p) => ({ region: p.region, pain: p.pain ?? Number.NaN })),
      numbness: form.numbness as boolean,
      note: form.note,
      redFlagAnswers: { ...form.redFlagAnswers },
    };
  }

  function check(): CheckInFormInput | null {
    const next: Record<string, string> = {};
    const input = body();
    const parsed = checkInFormSchema.safeParse(input);
    if (!parsed.success) for (const issue of parsed.error.issues) next[issue.path.join('.')] ??= issue.message;
    if (form.rides === null) next.rides = 'Say how many rides, 0 if none.';
    if (form.comfort === null) next.comfort = 'Tap how comfortable the rides felt, from 0 to 10.';
    if (form.numbness === null) next.numbness = 'Say whether you had numbness.';
    form.pains.forEach((p, i) => {
      if (p.pain === null) next[`pains.${i}.pain`] = 'Tap how much it hurt, from 0 to 10, or remove this area.';
    });
    for (const id of URGENT_FLAG_IDS) if (form.redFlagAnswers[id] === undefined) next[`redFlagAnswers.${id}`] = 'Please answer yes or no.';
    errors.value = next;
    return Object.keys(next).length === 0 ? input : null;
  }

  const summary = computed(() => [...new Set(Object.values(errors.value))]);

  async function submit(planId: number, stepIndex: number): Promise<CheckInAnswer | null> {
    formError.value = null;
    const input = check();
    if (!input) return null;
    submitting.value = true;
    try {
      return await checkInsApi.submit(planId, stepIndex, input);
    } catch (caught) {
      const error = asApiError(caught);
      formError.value = error;
      errors.value = { ...error.fields };
      return null;
    } finally {
      submitting.value = false;
    }
  }

  return { form, errors, formError, submitting, summary, selectedRegions, toggleRegion, answer, submit };
}
