import type { Metadata } from "next";
import Link from "next/link";
import { JoinForm } from "./join-form";

export const metadata: Metadata = { title: "Apply for an account" };

export default function JoinPage() {
  return (
    <div className="space-y-5">
      <header className="space-y-2">
        <h1 className="text-xl font-semibold tracking-tight">Apply for an account</h1>
        <p className="text-ink-soft">
          Reading and searching the verified corpus needs no account. An account lets you code papers and submit
          their model comparisons for verification. An admin reads every application and decides; you hear back by
          e-mail either way.
        </p>
      </header>
      <JoinForm />
      <p className="text-xs text-ink-soft">
        Already have an account? <Link href="/signin">Sign in</Link>.
      </p>
    </div>
  );
}
