import type { ErrorCode, FieldErrors } from "@/lib/errors";

// The shape every form action returns, for React's useActionState. Plain data, so client forms can
// import it; the guard that produces it lives in lib/auth/guard.ts (server only).

export interface ActionState {
  ok: boolean;
  code?: ErrorCode;
  message: string | null;
  fieldErrors: FieldErrors;
  /** the submitted text fields, to refill the form after an error (never passwords or tokens) */
  values?: Record<string, string>;
}

export const IDLE_STATE: ActionState = { ok: false, message: null, fieldErrors: {} };

export type FormAction = (previous: ActionState, formData: FormData) => Promise<ActionState>;
