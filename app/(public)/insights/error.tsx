"use client";

import { SegmentError } from "@/components/segment-error";

export default function InsightsError({ reset }: { error: Error; reset: () => void }) {
  return <SegmentError title="The statistics could not be computed." reset={reset} />;
}
