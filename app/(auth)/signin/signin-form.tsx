"use client";

import { getCsrfToken } from "next-auth/react";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { signInMessage } from "@/lib/auth/refusals";
import { signInSchema } from "@/lib/validation/account";

// Posts to next-auth's credentials endpoint directly (rather than through next-auth/react's signIn) so
// that a 429 from the rate limit reaches the form with its own message.

type FieldErrors = Partial<Record<"email" | "password", string[]>>;

export function SignInForm({ next, initialError }: { next: string; initialError: string | null }) {
  const [message, setMessage] = useState<string | null>(initialError);
  const [fieldErrors, setFieldErrors] = useState<FieldErrors>({});
  const [pending, setPending] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const parsed = signInSchema.safeParse({ email: data.get("email"), password: data.get("password") });
    if (!parsed.success) {
      const errors: FieldErrors = {};
      for (const issue of parsed.error.issues) {
        const key = issue.path[0] as keyof FieldErrors;
        (errors[key] ??= []).push(issue.message);
      }
      setFieldErrors(errors);
      setMessage(null);
      return;
    }
    setFieldErrors({});
    setMessage(null);
    setPending(true);
    try {
      const csrfToken = (await getCsrfToken()) ?? "";
      const response = await fetch("/api/auth/callback/credentials", {
        method: "POST",
        headers: { "Content-Type": "application/x-www-form-urlencoded" },
        body: new URLSearchParams({ email: parsed.data.email, password: parsed.data.password, csrfToken, json: "true" }),
      });
      const body = (await response.json().catch(() => ({}))) as { url?: string; error?: { message?: string } };
      if (response.status === 429) {
        setMessage(body.error?.message ?? signInMessage("rate-limited"));
        return;
      }
      const error = body.url ? new URL(body.url, window.location.origin).searchParams.get("error") : "unknown";
      if (response.ok && !error) {
        // a full load, so the header and every server component see the new session
        window.location.assign(next);
        return;
      }
      setMessage(signInMessage(error));
    } catch {
      setMessage("Fitledger could not be reached. Check your connection and try again.");
    } finally {
      setPending(false);
    }
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      {message ? <Notice tone="error">{message}</Notice> : null}
      <Field name="email" label="E-mail address" type="email" required autoComplete="email" autoFocus errors={fieldErrors.email} />
      <Field name="password" label="Password" type="password" required autoComplete="current-password" errors={fieldErrors.password} />
      <Button type="submit" disabled={pending}>
        {pending ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}
