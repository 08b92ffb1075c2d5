import type { Metadata } from "next";
import Link from "next/link";
import { safeLocalPath } from "@/lib/auth/safe-path";
import { signInMessage } from "@/lib/auth/refusals";
import { SignInForm } from "./signin-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const next = safeLocalPath(typeof params.next === "string" ? params.next : null);
  // next-auth sends people here with ?error=… when it refuses a sign-in without the form's help
  const error = typeof params.error === "string" ? signInMessage(params.error) : null;
  return (
    <div className="space-y-5">
      <header className="space-y-1">
        <h1 className="text-xl font-semibold tracking-tight">Sign in</h1>
        <p className="text-ink-soft">For contributors, curators and admins. Reading the verified corpus needs no account.</p>
      </header>
      <SignInForm next={next} initialError={error} />
      <ul className="space-y-1 text-xs text-ink-soft">
        <li>
          Forgot your password? <Link href="/reset">Choose a new one</Link>.
        </li>
        <li>
          No account yet? <Link href="/join">Apply for one</Link>.
        </li>
      </ul>
    </div>
  );
}
