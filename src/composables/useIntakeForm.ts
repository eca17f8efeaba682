import { computed, reactive, ref } from 'vue';
import { REGION_INFO, type BodyRegion, type RedFlagId } from '@shared/fit/triage';
import { currentConsent, intakeSubmitSchema, questionsToAsk, type BookingReadiness, type IntakeView } from '@shared/rider';
import { intakeApi } from '@/api/intake';
import { asApiError, type ApiError } from '@/api/http';
import { draftInput, emptySymptom, formFromIntake, submitInput, type IntakeFormState, type SymptomEntry } from '@/utils/intake-form';

/**
 * The state of "Tell us what hurts": the answers being written, saving a draft, and submitting.
 * Checks run here with the same schema the server uses, so most mistakes are caught before sending;
 * the server checks again and computes the triage itself.
 */
export function useIntakeForm() {
  const form = reactive<IntakeFormState>(formFromIntake(null));
  const errors = ref<Record<string, string>>({});
  const formError = ref<ApiError | null>(null);
  const saving = ref(false);
  const submitting = ref(false);
  const savedAt = ref<Date | null>(null);

  const questions = computed(() => questionsToAsk(form.redFlagAnswers as Partial<Record<RedFlagId, boolean>>, form.symptoms));
  const selectedRegions = computed(() => form.symptoms.map((s) => s.region));

  function load(intake: IntakeView | null): void {
    Object.assign(form, formFromIntake(intake));
    errors.value = {};
    formError.value = null;
  }

  function toggleRegion(region: BodyRegion): void {
    const at = form.symptoms.findIndex((s) => s.region === region);
    if (at >= 0) form.symptoms.splice(at, 1);
    else form.symptoms.push(emptySymptom(region));
  }

  function updateSymptom(index: number, entry: SymptomEntry): void {
    form.symptoms.splice(index, 1, entry);
  }

  function answer(id: RedFlagId, value: boolean): void {
    form.redFlagAnswers = { ...form.redFlagAnswers, [id]: value };
    const next = { ...errors.value };
    delete next[`redFlagAnswers.${id}`];
    errors.value = next;
  }

  /** Answers to questions no longer shown (a crash un-ticked) are not sent. */
  function visibleAnswers(): IntakeFormState {
    const shown = new Set<string>(questions.value);
    return { ...form, redFlagAnswers: Object.fromEntries(Object.entries(form.redFlagAnswers).filter(([id]) => shown.has(id))) };
  }

  async function saveDraft(): Promise<boolean> {
    if (saving.value) return false;
    saving.value = true;
    formError.value = null;
    try {
      await intakeApi.saveDraft(draftInput(visibleAnswers()));
      savedAt.value = new Date();
      return true;
    } catch (caught) {
      formError.value = asApiError(caught);
      errors.value = { ...formError.value.fields };
      return false;
    } finally {
      saving.value = false;
    }
  }

  function check(): Record<string, string> {
    const found: Record<string, string> = {};
    const input = submitInput(visibleAnswers(), currentConsent('store-health-data')!.version);
    const parsed = intakeSubmitSchema.safeParse(input);
    if (!parsed.success) for (const issue of parsed.error.issues) found[issue.path.join('.')] ??= issue.message;
    for (const id of questions.value) {
      if (typeof form.redFlagAnswers[id] !== 'boolean') found[`redFlagAnswers.${id}`] ??= 'Please answer every safety question.';
    }
    return found;
  }

  async function submit(): Promise<{ intake: IntakeView; readiness: BookingReadiness } | null> {
    if (submitting.value) return null;
    formError.value = null;
    errors.value = check();
    if (Object.keys(errors.value).length > 0) return null;
    submitting.value = true;
    try {
      return await intakeApi.submit(submitInput(visibleAnswers(), currentConsent('store-health-data')!.version));
    } catch (caught) {
      formError.value = asApiError(caught);
      errors.value = { ...formError.value.fields };
      return null;
    } finally {
      submitting.value = false;
    }
  }

  /** Plain sentences for the summary above the submit button, naming the body area they are about. */
  const summary = computed(() => {
    const messages = Object.entries(errors.value).map(([path, message]) => {
      const symptom = /^symptoms\.(\d+)\./.exec(path);
      const region = symptom ? form.symptoms[Number(symptom[1])]?.region : undefined;
      return region ? `${REGION_INFO[region].label}: ${message}` : message;
    });
    return [...new Set(messages)];
  });

  return { form, errors, formError, saving, submitting, savedAt, questions, selectedRegions, summary, load, toggleRegion, updateSymptom, answer, saveDraft, submit };
}
