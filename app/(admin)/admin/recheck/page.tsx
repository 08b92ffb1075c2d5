import type { Metadata } from "next";
import { recheckProgress } from "@/lib/curation/recheck-job";
import { ENGINE_VERSION } from "@/lib/recheck/settings";
import { RecheckPanel } from "./recheck-panel";

export const metadata: Metadata = { title: "Full recheck" };
export const dynamic = "force-dynamic";

export default function FullRecheckPage() {
  return (
    <div className="space-y-3">
      <h1 className="text-xl font-semibold tracking-tight">Recheck everything</h1>
      <p className="max-w-2xl text-ink-soft">
        After an engine change (now version {ENGINE_VERSION}) or new recheck settings, rewrite every paper&apos;s findings and stamp them with the engine version. It runs in the background, one paper at a time; the site stays usable. Curators&apos; verdicts stay with every finding that comes out unchanged.
      </p>
      <RecheckPanel initial={recheckProgress()} />
    </div>
  );
}
