/**
 * A server action's form argument as FormData. A direct POST can pass any value; anything that is not
 * FormData becomes an empty form, so the action answers with its own "check the form" message and
 * never a server error.
 */
export function asForm(form: unknown): FormData {
  return form instanceof FormData ? form : new FormData();
}
