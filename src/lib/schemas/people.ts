// Input schemas for people and sign-in forms, shared by the forms (zodResolver) and the server.
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";
import { ROLES } from "@/lib/enums";

export const PASSWORD_MIN = 10;

const email = z
  .string()
  .trim()
  .toLowerCase()
  .min(1, "Enter an e-mail address")
  .max(320)
  .pipe(z.email("Enter a valid e-mail address, like name@example.com"));
const personName = plainText().trim().min(1, "Enter a name").max(200, "Keep the name under 200 characters");
const password = z
  .string()
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters`)
  .max(128, "Use at most 128 characters");

export const roleSchema = z.enum(ROLES, { message: "Pick a role" });

export const signInSchema = z.object({ email, password: z.string().min(1, "Enter your password") });
export type SignInInput = z.input<typeof signInSchema>;

export const signUpSchema = z.object({
  companyName: plainText().trim().min(2, "Enter your company's name").max(200),
  name: personName,
  email,
  password,
});
export type SignUpInput = z.input<typeof signUpSchema>;

export const forgotPasswordSchema = z.object({ email });
export const resetPasswordSchema = z
  .object({ password, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ" });

export const inviteSchema = z.object({
  email,
  name: plainText().trim().max(200).optional(),
  role: roleSchema,
  /** An open invitation to the address is replaced (its link stops working) only when this says so. */
  replace: z.boolean().optional(),
});
export type InviteInput = z.input<typeof inviteSchema>;

export const acceptInvitationSchema = z
  .object({ token: z.string().min(20).max(200), name: personName, password, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ" });
export type AcceptInvitationInput = z.input<typeof acceptInvitationSchema>;

export const updatePersonSchema = z
  .object({ role: roleSchema.optional(), status: z.enum(["active", "deactivated"]).optional() })
  .refine((v) => v.role !== undefined || v.status !== undefined, { message: "Give a role or a status to change" });
export type UpdatePersonInput = z.input<typeof updatePersonSchema>;
