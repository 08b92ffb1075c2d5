import "server-only";
import { AppError } from "@/lib/errors";
import { createRateLimiter, type RateLimitDecision, type RateLimiter } from "@/lib/rate-limit";

// The account limits (issue 4): per network address and per e-mail address, so neither a single
// machine trying many addresses nor many machines trying one address gets far. Sign-in counts only
// failed attempts (a person who signs in often is never locked out); apply and reset count every
// attempt, since each one sends an e-mail. In-memory and per process: see lib/rate-limit.ts.

const MINUTE = 60_000;

function limiters() {
  return {
    signInFailuresByAddress: createRateLimiter({ limit: 30, windowMs: 15 * MINUTE }),
    signInFailuresByEmail: createRateLimiter({ limit: 10, windowMs: 15 * MINUTE }),
    applyByAddress: createRateLimiter({ limit: 10, windowMs: 60 * MINUTE }),
    applyByEmail: createRateLimiter({ limit: 3, windowMs: 60 * MINUTE }),
    resetByAddress: createRateLimiter({ limit: 10, windowMs: 60 * MINUTE }),
    resetByEmail: createRateLimiter({ limit: 3, windowMs: 60 * MINUTE }),
  } satisfies Record<string, RateLimiter>;
}

type Limiters = ReturnType<typeof limiters>;
const globalForLimits = globalThis as typeof globalThis & { __fitledgerLimits?: Limiters };
const current = () => (globalForLimits.__fitledgerLimits ??= limiters());

/** Tests start each scenario with empty counters. */
export function clearRateLimits(): void {
  globalForLimits.__fitledgerLimits = limiters();
}

export interface LimitSubject {
  address: string;
  email: string;
}

function minutes(seconds: number): string {
  const value = Math.ceil(seconds / 60);
  return value === 1 ? "a minute" : `${value} minutes`;
}

export function rateLimited(decisions: RateLimitDecision[], what: string): AppError | null {
  const denied = decisions.filter((decision) => !decision.allowed);
  if (denied.length === 0) return null;
  const retryAfter = Math.max(...denied.map((decision) => decision.retryAfterSeconds));
  return new AppError("rate_limited", `Too many ${what}. Try again in ${minutes(retryAfter)}.`, { headers: { "Retry-After": String(retryAfter) } });
}

const emailKey = (email: string) => email.trim().toLowerCase();

/** null when signing in may be tried; else the 429 to answer (checked before the password is). */
export function signInBlock(subject: LimitSubject): AppError | null {
  const limits = current();
  return rateLimited([limits.signInFailuresByAddress.peek(subject.address), limits.signInFailuresByEmail.peek(emailKey(subject.email))], "failed sign-in attempts");
}

export function recordSignInFailure(subject: LimitSubject): void {
  const limits = current();
  limits.signInFailuresByAddress.consume(subject.address);
  limits.signInFailuresByEmail.consume(emailKey(subject.email));
}

export function consumeApplyAttempt(subject: LimitSubject): void {
  const limits = current();
  const error = rateLimited([limits.applyByAddress.consume(subject.address), limits.applyByEmail.consume(emailKey(subject.email))], "applications");
  if (error) throw error;
}

export function consumeResetAttempt(subject: LimitSubject): void {
  const limits = current();
  const error = rateLimited([limits.resetByAddress.consume(subject.address), limits.resetByEmail.consume(emailKey(subject.email))], "password reset requests");
  if (error) throw error;
}
