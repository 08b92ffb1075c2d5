"use client";

import { useCallback, useEffect, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import type { RecheckProgress } from "@/lib/curation/recheck-job";

// Starts the full recheck and polls its progress (GET /api/admin/recheck) once a second while it runs.

export function RecheckPanel({ initial }: { initial: RecheckProgress }) {
  const [progress, setProgress] = useState(initial);
  const [message, setMessage] = useState<string | null>(null);

  const poll = useCallback(async () => {
    const response = await fetch("/api/admin/recheck", { cache: "no-store" });
    if (response.ok) setProgress(((await response.json()) as { progress: RecheckProgress }).progress);
  }, []);

  useEffect(() => {
    if (progress.state !== "running") return;
    const timer = setInterval(() => void poll(), 1000);
    return () => clearInterval(timer);
  }, [progress.state, poll]);

  async function start() {
    setMessage(null);
    const response = await fetch("/api/admin/recheck", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ confirm: "recheck-everything" }) });
    const body = await response.json();
    if (!response.ok) setMessage(body.error?.message ?? "The recheck could not be started.");
    if (body.progress) setProgress(body.progress);
    else void poll();
  }

  const percent = progress.total > 0 ? Math.round((100 * progress.done) / progress.total) : progress.state === "finished" ? 100 : 0;
  return (
    <div className="max-w-xl space-y-3">
      <Button onClick={() => void start()} disabled={progress.state === "running"}>
        {progress.state === "running" ? "Rechecking…" : "Recheck everything"}
      </Button>
      {message ? <Notice tone="error">{message}</Notice> : null}
      {progress.state !== "idle" ? (
        <div className="space-y-1">
          <label htmlFor="recheck-progress" className="block text-xs font-medium">
            {progress.state === "running" ? "Progress" : progress.state === "finished" ? "Last full recheck" : "Stopped"}
          </label>
          <progress id="recheck-progress" max={Math.max(progress.total, 1)} value={progress.done} className="h-3 w-full" aria-valuetext={`${percent} %`} />
          <p className="figures text-xs text-ink-soft" aria-live="polite">
            {progress.done} of {progress.total} papers ({percent} %) · {progress.flags} findings written · engine {progress.engineVersion}
            {progress.unreadable > 0 ? ` · ${progress.unreadable} unreadable comparisons` : ""}
            {progress.finishedAt ? ` · finished ${progress.finishedAt.slice(0, 19).replace("T", " ")} UTC` : ""}
          </p>
          {progress.error ? <Notice tone="error">{progress.error}</Notice> : null}
        </div>
      ) : null}
    </div>
  );
}
