import type { ReactNode } from "react";
import { requireSignedIn } from "@/lib/auth/current-user";

/** One's own account: any active, signed-in person. */
export default async function AccountLayout({ children }: { children: ReactNode }) {
  await requireSignedIn("/account");
  return <div className="max-w-3xl">{children}</div>;
}
