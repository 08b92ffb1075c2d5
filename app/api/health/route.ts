import { db } from "@/lib/db";

export const dynamic = "force-dynamic";

/** Liveness for load balancers and the demo: the app answers and the database takes a query. */
export async function GET() {
  try {
    const { sequelize } = await db();
    await sequelize.query("SELECT 1");
    return Response.json({ status: "ok", db: "ok" });
  } catch (error) {
    console.error("[health] database check failed", error);
    const reason = error instanceof Error ? error.message.split("\n")[0] : "unknown error";
    return Response.json({ status: "degraded", db: "unreachable", reason }, { status: 503 });
  }
}
