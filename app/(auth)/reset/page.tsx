import type { Metadata } from "next";
import Link from "next/link";
import { ResetRequestForm } from "./reset-request-form";

export const metadata: Metadata = { title: "Choose a new password" };

export default function ResetRequestPage() {
  return (
    <div className="space-y-5">
      <header className="space-y-1">
        <h1 className="text-xl font-semibold tracking-tight">Choose a new password</h1>
        <p className="text-ink-soft">Give the address of your account and we will e-mail you a link to set a new password.</p>
      </header>
      <ResetRequestForm />
      <p className="text-xs text-ink-soft">
        Remembered it? <Link href="/signin">Sign in</Link>.
      </p>
    </div>
  );
}
