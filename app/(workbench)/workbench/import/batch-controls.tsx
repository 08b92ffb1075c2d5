"use client";

import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";

/** Re-reads the page every second while an import (or its DOI lookups) is still running. */
export function AutoRefresh({ active }: { active: boolean }) {
  const router = useRouter();
  useEffect(() => {
    if (!active) return;
    const timer = setInterval(() => router.refresh(), 1000);
    return () => clearInterval(timer);
  }, [active, router]);
  return null;
}

/** A button that POSTs to one of the import's endpoints and re-reads the page. */
export function PostButton({ url, label, busyLabel, tone = "primary" }: { url: string; label: string; busyLabel: string; tone?: "primary" | "secondary" }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function press() {
    setBusy(true);
    setError(null);
    const response = await fetch(url, { method: "POST" }).catch(() => null);
    if (!response || !response.ok) {
      const body = (await response?.json().catch(() => null)) as { error?: { message: string } } | null;
      setError(body?.error?.message ?? "That did not work. Try again.");
    }
    setBusy(false);
    router.refresh();
  }
  return (
    <span className="inline-flex flex-col gap-1">
      <Button tone={tone} onClick={press} disabled={busy}>
        {busy ? busyLabel : label}
      </Button>
      {error ? <Notice tone="error">{error}</Notice> : null}
    </span>
  );
}
