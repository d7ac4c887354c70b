import { z } from "zod";

export const PROJECT_NAME_MAX = 120;
export const PROJECT_DESCRIPTION_MAX = 2000;

export const projectCreateSchema = z.object({
  teamId: z.uuid({ error: "Choose a team." }),
  name: z
    .string({ error: "Give the project a name." })
    .trim()
    .min(1, "Give the project a name.")
    .max(PROJECT_NAME_MAX, `Keep the name under ${PROJECT_NAME_MAX} characters.`),
  description: z
    .string()
    .trim()
    .max(PROJECT_DESCRIPTION_MAX, `Keep the description under ${PROJECT_DESCRIPTION_MAX} characters.`)
    .optional()
    .nullable()
    .transform((v) => (v ? v : null)),
});

export const projectListQuerySchema = z.object({
  teamId: z.uuid({ error: "Not a valid team id." }).optional(),
});

export const tokenCreateSchema = z.object({
  name: z
    .string({ error: "Name the token after the script that will use it." })
    .trim()
    .min(1, "Name the token after the script that will use it.")
    .max(80, "Keep the name under 80 characters."),
});

export type ProjectCreateInput = z.infer<typeof projectCreateSchema>;
