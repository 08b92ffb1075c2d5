// The full recheck (admins): POST starts it in the background (it never blocks requests), GET reports
// its progress for the admin page's progress bar.
import { withRole } from "@/lib/auth/guard";
import { recheckProgress, startFullRecheck } from "@/lib/curation/recheck-job";
import { AppError } from "@/lib/errors";
import { fullRecheckSchema } from "@/lib/validation/curation";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

export const GET = withRole("admin", null, async () => Response.json({ progress: recheckProgress() }));

export const POST = withRole("admin", fullRecheckSchema, async (_input, user) => {
  if (!startFullRecheck({ actorId: user.id })) throw new AppError("conflict", "A full recheck is already running.");
  return Response.json({ progress: recheckProgress() }, { status: 202 });
});
