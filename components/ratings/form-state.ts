/** Mirrors SetupFormState of the set-up actions (kept here so client components import no server code). */
export type FormState = { ok: boolean; message: string; fieldErrors?: Record<string, string>; values?: Record<string, string> };
export const EMPTY_FORM: FormState = { ok: false, message: "" };
