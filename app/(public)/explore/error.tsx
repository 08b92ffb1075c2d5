"use client";

import { SegmentError } from "@/components/segment-error";

export default function ExploreError({ reset }: { error: Error; reset: () => void }) {
  return <SegmentError title="The search could not be shown." reset={reset} />;
}
