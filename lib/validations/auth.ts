import { z } from "zod";

const email = z
  .string({ error: "Enter your e-mail address." })
  .trim()
  .min(1, "Enter your e-mail address.")
  .max(254, "That e-mail address is too long.")
  .pipe(z.email({ error: "Enter a valid e-mail address, like ada@example.com." }))
  .transform((v) => v.toLowerCase());

export const signInSchema = z.object({
  email,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password.").max(200, "Too long."),
});

export const PASSWORD_MIN = 10;

export const signUpSchema = z.object({
  name: z
    .string({ error: "Enter your name." })
    .trim()
    .min(1, "Enter your name.")
    .max(80, "Keep your name under 80 characters."),
  email,
  password: z
    .string({ error: "Choose a password." })
    .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
    .max(200, "Keep the password under 200 characters."),
});

export const profileUpdateSchema = z.object({
  name: signUpSchema.shape.name,
});

/** "Forgot your password?": the address to send a reset link to. */
export const resetRequestSchema = z.object({ email });

/** The new password from a reset link, typed twice. */
export const resetPasswordSchema = z
  .object({
    token: z.string().min(20).max(100),
    password: signUpSchema.shape.password,
    confirm: z.string({ error: "Type the new password again." }),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });

export type SignUpInput = z.infer<typeof signUpSchema>;
