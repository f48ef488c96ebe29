import { z } from "zod";
import { ROLES } from "./roles";

// One schema per concept, shared by the API routes and the forms.

export const PASSWORD_MIN = 10;
// bcrypt reads at most 72 bytes; refuse longer rather than silently ignore the rest.
export const PASSWORD_MAX_BYTES = 72;

export const emailSchema = z
  .string({ error: "Enter an e-mail address." })
  .trim()
  .toLowerCase()
  .min(1, "Enter an e-mail address.")
  .max(254, "The e-mail address is too long.")
  .pipe(z.email({ error: "Enter a valid e-mail address, like name@example.com." }));

export const newPasswordSchema = z
  .string({ error: "Enter a password." })
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
  .refine((p) => new TextEncoder().encode(p).length <= PASSWORD_MAX_BYTES, {
    message: `Use at most ${PASSWORD_MAX_BYTES} bytes (about ${PASSWORD_MAX_BYTES} plain letters).`,
  })
  .refine((p) => p.trim().length === p.length, { message: "Don't start or end the password with a space." });

export const personNameSchema = z
  .string({ error: "Enter a name." })
  .trim()
  .min(1, "Enter a name.")
  .max(120, "Use at most 120 characters.")
  .refine((v) => !/[\u0000-\u001f\u007f-\u009f]/.test(v), "Don't use control characters in a name.");

export const roleSchema = z.enum(ROLES, { error: `Choose one of: ${ROLES.join(", ")}.` });
export const unitsSchema = z.enum(["si", "us"], { error: "Choose SI or US customary units." });

/** A one-time token from an e-mailed link (URL-safe base64 of 32 random bytes). */
export const tokenSchema = z
  .string({ error: "The link has no token." })
  .regex(/^[A-Za-z0-9_-]{43}$/, "This link is not valid. Copy the whole link from the e-mail.");

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password.").max(200, "The password is too long."),
});

export const forgotPasswordSchema = z.object({ email: emailSchema });

export const resetPasswordSchema = z.object({ token: tokenSchema, password: newPasswordSchema });

export const acceptInviteSchema = z.object({
  token: tokenSchema,
  name: personNameSchema,
  password: newPasswordSchema,
});

export const inviteUserSchema = z.object({ email: emailSchema, name: personNameSchema, role: roleSchema });

export const updateUserSchema = z
  .object({ role: roleSchema.optional(), active: z.boolean({ error: "Use true or false." }).optional() })
  .strict()
  .refine((v) => v.role !== undefined || v.active !== undefined, {
    message: "Send a new role, a new active state, or both.",
  });

export const changePasswordSchema = z
  .object({
    currentPassword: z.string({ error: "Enter your current password." }).min(1, "Enter your current password."),
    newPassword: newPasswordSchema,
  })
  .refine((v) => v.currentPassword !== v.newPassword, {
    message: "Choose a password different from the current one.",
    path: ["newPassword"],
  });

export const profileSchema = z
  .object({ name: personNameSchema.optional(), units: unitsSchema.optional() })
  .strict()
  .refine((v) => v.name !== undefined || v.units !== undefined, { message: "Send a name, units, or both." });

export type InviteUserInput = z.infer<typeof inviteUserSchema>;
export type UpdateUserInput = z.infer<typeof updateUserSchema>;
export type ProfileInput = z.infer<typeof profileSchema>;
