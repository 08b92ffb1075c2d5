import type { ReactNode } from "react";

// A labelled form control with its hint and its errors tied to it through aria-describedby, so a
// screen reader announces both when the control gets focus. Works in server and client components.

const CONTROL =
  "w-full rounded border bg-paper-raised px-2.5 py-1.5 text-sm text-ink placeholder:text-ink-faint focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-ledger";

interface Common {
  /** the form field name; also the base of the element ids unless `id` is given */
  name: string;
  label: string;
  id?: string;
  hint?: ReactNode;
  errors?: string[];
  required?: boolean;
  className?: string;
}

function ids(props: Common) {
  const id = props.id ?? `field-${props.name}`;
  const hintId = props.hint ? `${id}-hint` : undefined;
  const errorId = props.errors?.length ? `${id}-error` : undefined;
  return { id, hintId, errorId, describedBy: [hintId, errorId].filter(Boolean).join(" ") || undefined };
}

function Frame({ props, id, hintId, errorId, children }: { props: Common; id: string; hintId?: string; errorId?: string; children: ReactNode }) {
  return (
    <div className={`space-y-1 ${props.className ?? ""}`}>
      <label htmlFor={id} className="block text-xs font-medium text-ink">
        {props.label}
        {props.required ? null : <span className="font-normal text-ink-faint"> (optional)</span>}
      </label>
      {children}
      {props.hint ? (
        <p id={hintId} className="text-xs text-ink-soft">
          {props.hint}
        </p>
      ) : null}
      {errorId ? (
        <p id={errorId} className="text-xs text-finding-error">
          {props.errors!.join(" ")}
        </p>
      ) : null}
    </div>
  );
}

export function Field(
  props: Common & { type?: "text" | "email" | "password" | "search"; defaultValue?: string; autoComplete?: string; maxLength?: number; placeholder?: string; autoFocus?: boolean },
) {
  const { id, hintId, errorId, describedBy } = ids(props);
  return (
    <Frame props={props} id={id} hintId={hintId} errorId={errorId}>
      <input
        id={id}
        name={props.name}
        type={props.type ?? "text"}
        defaultValue={props.defaultValue}
        autoComplete={props.autoComplete}
        maxLength={props.maxLength}
        placeholder={props.placeholder}
        required={props.required}
        autoFocus={props.autoFocus}
        aria-invalid={errorId ? true : undefined}
        aria-describedby={describedBy}
        className={`${CONTROL} ${errorId ? "border-finding-error" : "border-rule-strong"}`}
      />
    </Frame>
  );
}

export function TextAreaField(props: Common & { defaultValue?: string; rows?: number; maxLength?: number }) {
  const { id, hintId, errorId, describedBy } = ids(props);
  return (
    <Frame props={props} id={id} hintId={hintId} errorId={errorId}>
      <textarea
        id={id}
        name={props.name}
        rows={props.rows ?? 4}
        defaultValue={props.defaultValue}
        maxLength={props.maxLength}
        required={props.required}
        aria-invalid={errorId ? true : undefined}
        aria-describedby={describedBy}
        className={`${CONTROL} ${errorId ? "border-finding-error" : "border-rule-strong"}`}
      />
    </Frame>
  );
}

export function SelectField(props: Common & { options: { value: string; label: string }[]; defaultValue?: string }) {
  const { id, hintId, errorId, describedBy } = ids(props);
  return (
    <Frame props={{ ...props, required: true }} id={id} hintId={hintId} errorId={errorId}>
      <select
        id={id}
        name={props.name}
        defaultValue={props.defaultValue}
        aria-invalid={errorId ? true : undefined}
        aria-describedby={describedBy}
        className={`${CONTROL} ${errorId ? "border-finding-error" : "border-rule-strong"}`}
      >
        {props.options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
    </Frame>
  );
}
