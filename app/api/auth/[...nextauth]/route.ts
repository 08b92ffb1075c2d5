import { handleAuthRequest } from "@/lib/auth/next-auth-route";

// next-auth's endpoints (csrf, session, the credentials callback, sign-out). Public by nature: each
// endpoint checks what it needs (CSRF token, password); the sign-in rate limit sits in front.
export const dynamic = "force-dynamic";

type Context = { params: Promise<{ nextauth?: string[] }> };

export async function GET(request: Request, context: Context) {
  const { nextauth } = await context.params;
  return handleAuthRequest(request, nextauth ?? []);
}

export async function POST(request: Request, context: Context) {
  const { nextauth } = await context.params;
  return handleAuthRequest(request, nextauth ?? []);
}
