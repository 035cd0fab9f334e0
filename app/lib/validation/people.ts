import { z } from "zod";
import { roles } from "../roles.ts";

const email = z
  .string({ error: "Enter an e-mail address." })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: "Enter a valid e-mail address, like name@example.com." }));

export const loginSchema = z.object({
  email,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password."),
  redirectTo: z.string().optional(),
});

export const inviteSchema = z.object({
  email,
  name: z.string({ error: "Enter the person's name." }).trim().min(2, "Enter the person's name.").max(120),
  role: z.enum(roles, { error: "Choose a role." }),
});

/** bcrypt reads only the first 72 bytes of a password: anything longer is refused, not cut. */
export const PASSWORD_MAX_BYTES = 72;

export const newPasswordSchema = z
  .object({
    password: z
      .string({ error: "Choose a password." })
      .min(10, "Use at least 10 characters.")
      .refine((p) => new TextEncoder().encode(p).length <= PASSWORD_MAX_BYTES, {
        message: `This password is too long: keep it under ${PASSWORD_MAX_BYTES} bytes (about 70 letters, fewer with accents or emoji).`,
      }),
    confirm: z.string({ error: "Type the password again." }),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });

export const userChangeSchema = z.discriminatedUnion("intent", [
  z.object({
    intent: z.literal("role"),
    userId: z.coerce.number().int().positive(),
    role: z.enum(roles, { error: "Choose a role." }),
  }),
  z.object({ intent: z.literal("deactivate"), userId: z.coerce.number().int().positive() }),
  z.object({ intent: z.literal("reactivate"), userId: z.coerce.number().int().positive() }),
  z.object({ intent: z.literal("reinvite"), userId: z.coerce.number().int().positive() }),
]);
