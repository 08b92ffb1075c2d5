"use client";

import { Notice } from "@/components/ui/notice";

/** The body of a route segment's error.tsx: what failed, that it was logged, and a retry. */
export function SegmentError({ title, reset }: { title: string; reset: () => void }) {
  return (
    <Notice tone="error" title={title}>
      Something went wrong on our side; it has been logged.{" "}
      <button type="button" className="underline" onClick={reset}>
        Try again
      </button>
    </Notice>
  );
}
