import { AppError } from "@/lib/errors";
import { errorResponse } from "@/lib/http/respond";

// Any /api address without a handler answers JSON, never the HTML not-found page (DESIGN §6).
function notFound(request: Request) {
  const { pathname } = new URL(request.url);
  return errorResponse(new AppError("not_found", `No API endpoint at ${pathname}.`));
}

export { notFound as GET, notFound as POST, notFound as PUT, notFound as PATCH, notFound as DELETE };
