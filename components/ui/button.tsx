"use client";

import type { ButtonHTMLAttributes } from "react";
import { useFormStatus } from "react-dom";

export type ButtonTone = "primary" | "secondary" | "danger";

const TONES: Record<ButtonTone, string> = {
  primary: "border-ledger bg-ledger text-paper-raised hover:bg-ledger-deep",
  secondary: "border-rule-strong bg-paper-raised text-ink hover:bg-paper-sunk",
  danger: "border-finding-error bg-paper-raised text-finding-error hover:bg-finding-error-tint",
};

export function buttonClass(tone: ButtonTone = "primary", size: "normal" | "small" = "normal"): string {
  const padding = size === "small" ? "px-2 py-1 text-xs" : "px-3 py-1.5 text-sm";
  return `inline-flex items-center justify-center rounded border font-medium disabled:cursor-not-allowed disabled:opacity-60 ${padding} ${TONES[tone]}`;
}

export function Button({ tone = "primary", size = "normal", className = "", type = "button", ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: ButtonTone; size?: "normal" | "small" }) {
  return <button type={type} className={`${buttonClass(tone, size)} ${className}`} {...rest} />;
}

/** A submit button that shows it is working while its form's action runs, and cannot be pressed twice. */
export function SubmitButton({ children, pendingLabel, ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: ButtonTone; size?: "normal" | "small"; pendingLabel?: string }) {
  const { pending } = useFormStatus();
  return (
    <Button type="submit" disabled={pending || rest.disabled} aria-disabled={pending || undefined} {...rest}>
      {pending ? (pendingLabel ?? "Working…") : children}
    </Button>
  );
}
