import type { ReactNode } from "react";
import { Notice } from "@/components/ui/notice";
import { requireRole } from "@/lib/auth/current-user";

/** The coder's side: contributors and everyone above them. */
export default async function WorkbenchLayout({ children }: { children: ReactNode }) {
  const { allowed } = await requireRole("contributor", "/workbench");
  if (!allowed) {
    return (
      <Notice title="The workbench is for contributors">
        Your account can search and read the verified corpus and save searches. To code papers yourself, ask an admin
        to make you a contributor.
      </Notice>
    );
  }
  return <>{children}</>;
}
