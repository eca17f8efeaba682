import { nextTick, ref } from 'vue';
import type { z } from 'zod';
import { ApiError, asApiError } from '@/api/http';

/**
 * Field and form messages for one form, whether they come from our zod check before sending
 * or from the server's `fields` after. Also wires each input's ARIA state to its message.
 */
export function useFormErrors<Field extends string>(formId: string) {
  const fields = ref<Partial<Record<Field, string>>>({});
  const formError = ref<ApiError | null>(null);

  function errorId(field: Field): string {
    return `${formId}-${field}-error`;
  }

  /** Attributes for the input of `field`: marks it invalid and points at its message. */
  function inputAttrs(field: Field): Record<string, string | undefined> {
    const invalid = Boolean(fields.value[field]);
    return { 'aria-invalid': invalid ? 'true' : undefined, 'aria-describedby': invalid ? errorId(field) : undefined };
  }

  function clear(field?: Field): void {
    if (field) {
      const next = { ...fields.value };
      delete next[field];
      fields.value = next;
      return;
    }
    fields.value = {};
    formError.value = null;
  }

  function setFromZod(error: z.ZodError): void {
    const next: Partial<Record<Field, string>> = {};
    for (const issue of error.issues) {
      const key = issue.path.join('.') as Field;
      // The first message per field is the one to fix first.
      next[key] ??= issue.message;
    }
    fields.value = next;
    formError.value = null;
  }

  function setFromApi(error: unknown): void {
    const apiError = asApiError(error);
    fields.value = { ...(apiError.fields as Partial<Record<Field, string>>) };
    formError.value = apiError;
  }

  /** Moves keyboard focus to the first field with a message, so it is read out and easy to fix. */
  async function focusFirstInvalid(root: HTMLElement | null | undefined): Promise<void> {
    await nextTick();
    root?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
  }

  return { fields, formError, errorId, inputAttrs, clear, setFromZod, setFromApi, focusFirstInvalid };
}
