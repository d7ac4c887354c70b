"use server";

import { revalidatePath } from "next/cache";
import { type FormState, failureState, formValues, issuesToFields } from "@/lib/actions/state";
import { createProject } from "@/lib/projects";
import { requireUser } from "@/lib/session";
import { projectCreateSchema } from "@/lib/validations/project";

/** Form action: creates a project in a team where the caller is owner or designer. */
export async function createProjectAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const actor = await requireUser();
  const values = formValues(formData, ["name", "description"]);
  const parsed = projectCreateSchema.safeParse({
    teamId: formData.get("teamId"),
    name: formData.get("name"),
    description: formData.get("description") || undefined,
  });
  if (!parsed.success) {
    return {
      ok: false,
      message: "Check the highlighted fields.",
      errors: issuesToFields(parsed.error.issues),
      values,
    };
  }
  let name: string;
  try {
    name = (await createProject(actor.userId, parsed.data)).name;
  } catch (err) {
    return { ...failureState(err, "createProject"), values };
  }
  revalidatePath("/projects");
  return { ok: true, message: `Project “${name}” created.` };
}
