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

export const newPasswordSchema = z
  .object({
    password: z.string({ error: "Choose a password." }).min(10, "Use at least 10 characters.").max(200),
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
