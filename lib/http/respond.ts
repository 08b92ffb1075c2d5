import { AppError, isAppError } from "@/lib/errors";

/** The JSON error body of every /api route: `{error: {code, message, fields?}}` (DESIGN §6). */
export interface ErrorBody {
  error: { code: string; message: string; fields?: Record<string, string[]> };
}

export function errorResponse(error: AppError): Response {
  const body: ErrorBody = { error: { code: error.code, message: error.message } };
  if (error.fields) body.error.fields = error.fields;
  return Response.json(body, { status: error.status, headers: error.headers });
}

/**
 * Runs a route handler body and turns any failure into the JSON error shape. Unknown errors are logged
 * with their stack on the server and answered with a generic 500 — never a stack trace to the client.
 */
export async function respond(work: () => Promise<Response>): Promise<Response> {
  try {
    return await work();
  } catch (error) {
    if (isAppError(error)) return errorResponse(error);
    console.error("[api] unhandled error", error);
    return errorResponse(new AppError("internal", "Something went wrong on our side. The error has been logged."));
  }
}
