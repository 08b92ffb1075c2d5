import { applyForAccount } from "@/lib/auth/accounts";
import { clientAddressFrom } from "@/lib/auth/client-address";
import { withPublicInput } from "@/lib/auth/guard";
import { applySchema } from "@/lib/validation/account";

// JSON twin of the /join form. The answer is the same whether or not the address already has an
// account (no enumeration); too many attempts give 429 with Retry-After.
export const POST = withPublicInput(applySchema, async (input, request) => {
  await applyForAccount(input, { address: clientAddressFrom(request.headers) });
  return Response.json(
    { status: "received", message: "Thank you. An admin will review the application; the decision is sent to the address given." },
    { status: 202 },
  );
});
