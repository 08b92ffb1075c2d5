import type { ReactNode } from "react";

/** Applying, signing in and resetting a password: one narrow column, nothing else to distract. */
export default function AuthLayout({ children }: { children: ReactNode }) {
  return <div className="mx-auto w-full max-w-md py-4">{children}</div>;
}
