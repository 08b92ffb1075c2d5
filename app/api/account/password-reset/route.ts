import { clientAddressFrom } from "@/lib/auth/client-address";
import { withPublicInput } from "@/lib/auth/guard";
import { requestPasswordReset } from "@/lib/auth/password-reset";
import { resetRequestSchema } from "@/lib/validation/account";

// JSON twin of the /reset form: the same answer whether or not the address has an account.
export const POST = withPublicInput(resetRequestSchema, async (input, request) => {
  await requestPasswordReset(input, { address: clientAddressFrom(request.headers) });
  return Response.json({ status: "sent-if-registered", message: "If an active account uses that address, a reset link is on its way. It works once, for an hour." }, { status: 202 });
});
