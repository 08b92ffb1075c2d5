import { z } from "zod";
import { ROLE_ORDER, STATUS_ORDER } from "@/lib/auth/roles";

// One schema per input, shared by the forms (client) and the server actions and route handlers.
// Unknown keys are dropped by z.object, so a forged `role` or `status` in a body never reaches a write.

/** Stated on every form that sets a password. bcrypt reads at most 72 bytes, hence the upper bound. */
export const PASSWORD_RULE = "At least 12 characters; a short phrase of several words works well. At most 72 bytes.";
export const PASSWORD_MIN = 12;
export const PASSWORD_MAX_BYTES = 72;

const byteLength = (value: string) => new TextEncoder().encode(value).length;

export const emailField = z
  .string({ error: "Enter your e-mail address." })
  .trim()
  .toLowerCase()
  .max(320, { error: "An e-mail address has at most 320 characters." })
  .pipe(z.email({ error: "Enter an e-mail address such as name@university.edu." }));

export const newPasswordField = z
  .string({ error: "Choose a password." })
  .min(PASSWORD_MIN, { error: `Use at least ${PASSWORD_MIN} characters.` })
  .refine((value) => byteLength(value) <= PASSWORD_MAX_BYTES, { error: `Use at most ${PASSWORD_MAX_BYTES} bytes (fewer with accented letters).` })
  .refine((value) => new Set(value).size >= 4, { error: "Use more than a few different characters." });

/** a password being checked, not chosen: no strength rule, only a sanity bound */
const currentPasswordField = z.string({ error: "Enter your password." }).min(1, { error: "Enter your password." }).max(1000, { error: "That password is too long." });

const nameField = z
  .string({ error: "Enter your name." })
  .trim()
  .min(1, { error: "Enter your name." })
  .max(200, { error: "Names have at most 200 characters." });

const affiliationField = z
  .string()
  .trim()
  .max(300, { error: "An affiliation has at most 300 characters." })
  .optional()
  .transform((value) => (value ? value : null));

const reasonField = z
  .string({ error: "Tell us briefly why you would like an account." })
  .trim()
  .min(1, { error: "Tell us briefly why you would like an account." })
  .max(2000, { error: "Keep the reason under 2000 characters." });

function passwordsMatch<T extends z.ZodType<Record<string, unknown>>>(schema: T, field: string, confirm: string) {
  return schema.refine((values) => values[field] === values[confirm], { error: "The two passwords differ.", path: [confirm] });
}

export const applySchema = passwordsMatch(
  z.object({
    name: nameField,
    email: emailField,
    affiliation: affiliationField,
    reason: reasonField,
    password: newPasswordField,
    passwordConfirm: z.string().optional(),
  }),
  "password",
  "passwordConfirm",
).refine((values) => values.password.toLowerCase() !== values.email, { error: "Do not use your e-mail address as the password.", path: ["password"] });
export type ApplyInput = z.output<typeof applySchema>;

export const signInSchema = z.object({ email: emailField, password: currentPasswordField });
export type SignInInput = z.output<typeof signInSchema>;

export const resetRequestSchema = z.object({ email: emailField });

export const resetConfirmSchema = passwordsMatch(
  z.object({
    token: z.string({ error: "This link is incomplete." }).trim().min(20, { error: "This link is incomplete." }).max(200, { error: "This link is not valid." }),
    password: newPasswordField,
    passwordConfirm: z.string().optional(),
  }),
  "password",
  "passwordConfirm",
);

export const profileSchema = z.object({ name: nameField, affiliation: affiliationField });

export const changePasswordSchema = passwordsMatch(
  z.object({ currentPassword: currentPasswordField, newPassword: newPasswordField, newPasswordConfirm: z.string().optional() }),
  "newPassword",
  "newPasswordConfirm",
);

// ---- admin: people ---------------------------------------------------------------------------------

const userIdField = z.coerce.number({ error: "No account was named." }).int().positive({ error: "No account was named." });
const roleField = z.enum(ROLE_ORDER, { error: "Choose one of the listed roles." });
const noteField = (what: string) =>
  z.string({ error: `Give a ${what}.` }).trim().min(1, { error: `Give a ${what}; the person will read it.` }).max(1000, { error: "Keep it under 1000 characters." });

export const approveSchema = z.object({ userId: userIdField, role: roleField.default("contributor") });
export const declineSchema = z.object({ userId: userIdField, reason: noteField("reason") });
export const suspendSchema = z.object({ userId: userIdField, reason: noteField("reason") });
export const reactivateSchema = z.object({ userId: userIdField });
export const changeRoleSchema = z.object({ userId: userIdField, role: roleField });

export const PEOPLE_PAGE_SIZE = 25;
export const peopleQuerySchema = z.object({
  status: z.enum(STATUS_ORDER).catch("pending"),
  q: z.string().trim().max(200).catch(""),
  page: z.coerce.number().int().min(1).max(100_000).catch(1),
});

export const retryMessageSchema = z.object({ messageId: z.coerce.number().int().positive({ error: "No message was named." }) });
