import type { ReactNode } from "react";

/** Pages anyone may read: only verified entries appear here. */
export default function PublicLayout({ children }: { children: ReactNode }) {
  return <>{children}</>;
}
