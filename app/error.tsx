"use client";

import { useEffect } from "react";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <div role="alert" className="max-w-xl space-y-3 py-10">
      <h1 className="text-xl font-semibold">This page could not be shown</h1>
      <p className="text-ink-soft">
        Something failed on our side; it has been logged{error.digest ? ` (reference ${error.digest})` : ""}. Your
        data is unchanged.
      </p>
      <button type="button" onClick={reset} className="rounded border border-rule-strong bg-paper-raised px-3 py-1.5 hover:bg-paper-sunk">
        Try again
      </button>
    </div>
  );
}
