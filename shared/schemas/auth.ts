import { z } from "zod";
import { ROLES } from "../auth/roles";

/** Shared password rule for new accounts and password changes. */
export const passwordSchema = z
  .string({ error: "Required" })
  .min(10, "Use at least 10 characters")
  .max(200, "Use at most 200 characters");

export const emailSchema = z
  .string({ error: "Required" })
  .trim()
  .toLowerCase()
  .min(1, "Required")
  .max(254, "Too long")
  .pipe(z.email("Enter a valid e-mail address"));

export const loginInputSchema = z.object({
  email: emailSchema,
  password: z.string({ error: "Required" }).min(1, "Required").max(200, "Too long"),
});
export type LoginInput = z.infer<typeof loginInputSchema>;

export const userDtoSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  companyId: z.number().int(),
});
export type UserDto = z.infer<typeof userDtoSchema>;

/** A team member as the owner's Team page lists them. */
export const teamMemberDtoSchema = userDtoSchema.extend({
  active: z.boolean(),
  createdAt: z.string(),
  lastLoginAt: z.string().nullable(),
});
export type TeamMemberDto = z.infer<typeof teamMemberDtoSchema>;

export const createUserInputSchema = z.object({
  email: emailSchema,
  name: z.string({ error: "Required" }).trim().min(1, "Required").max(120, "Use at most 120 characters"),
  role: z.enum(ROLES, { error: "Pick a role" }),
  password: passwordSchema,
});
export type CreateUserInput = z.infer<typeof createUserInputSchema>;

export const updateUserInputSchema = z
  .object({
    role: z.enum(ROLES, { error: "Pick a role" }).optional(),
    active: z.boolean({ error: "Must be true or false" }).optional(),
    name: z.string().trim().min(1, "Required").max(120, "Use at most 120 characters").optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: "Nothing to change" });
export type UpdateUserInput = z.infer<typeof updateUserInputSchema>;

/** The owner sets a new password for a team member. */
export const setPasswordInputSchema = z.object({ password: passwordSchema });
export type SetPasswordInput = z.infer<typeof setPasswordInputSchema>;

/** A signed-in user changes their own password. */
export const changePasswordInputSchema = z
  .object({
    currentPassword: z.string({ error: "Required" }).min(1, "Required").max(200, "Too long"),
    newPassword: passwordSchema,
  })
  .refine((v) => v.currentPassword !== v.newPassword, {
    path: ["newPassword"],
    message: "Choose a password different from the current one",
  });
export type ChangePasswordInput = z.infer<typeof changePasswordInputSchema>;

/** "Forgot password": where to send a reset link (the answer is the same whether or not the e-mail is known). */
export const forgotPasswordInputSchema = z.object({ email: emailSchema });
export type ForgotPasswordInput = z.infer<typeof forgotPasswordInputSchema>;

/** A new password with the one-time token from the reset e-mail's link. */
export const resetPasswordInputSchema = z.object({
  token: z
    .string({ error: "Required" })
    .trim()
    .min(1, "Required")
    .max(200, "That reset link is not valid")
    .regex(/^[A-Za-z0-9_-]+$/, "That reset link is not valid"),
  password: passwordSchema,
});
export type ResetPasswordInput = z.infer<typeof resetPasswordInputSchema>;
