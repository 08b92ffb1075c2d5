"use client";

import { Notice } from "@/components/ui/notice";

export default function ExploreError({ reset }: { error: Error; reset: () => void }) {
  return (
    <Notice tone="error" title="The search could not be shown.">
      Something went wrong on our side; it has been logged.{" "}
      <button type="button" className="underline" onClick={reset}>
        Try again
      </button>
    </Notice>
  );
}
