import type { Metadata } from "next";
import Link from "next/link";
import { Notice } from "@/components/ui/notice";
import { NewPasswordForm } from "./new-password-form";

// The token is in this page's address: tell the browser not to pass the address on to other sites.
export const metadata: Metadata = { title: "Set a new password", referrer: "no-referrer" };

export default async function NewPasswordPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { token } = await searchParams;
  return (
    <div className="space-y-5">
      <header className="space-y-1">
        <h1 className="text-xl font-semibold tracking-tight">Set a new password</h1>
      </header>
      {typeof token === "string" && token ? (
        <NewPasswordForm token={token} />
      ) : (
        <Notice tone="error">
          This page needs the link from the e-mail. <Link href="/reset">Ask for a new link</Link>.
        </Notice>
      )}
    </div>
  );
}
