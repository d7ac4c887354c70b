import { z } from "zod";
import { FORMS_OF, READING_FORMS, READING_QUANTITIES } from "@/lib/reading-kinds";

export const MAX_READING_NOTE_CHARS = 2000;

/** "" and null (empty form fields) count as not given. */
const blank = (v: unknown) => (v === "" || v === null ? undefined : v);

const positive = (what: string) =>
  z.preprocess(
    blank,
    z.coerce
      .number(`${what} must be a number.`)
      .finite(`${what} must be a finite number.`)
      .positive(`${what} must be above 0.`)
      .optional(),
  );

const text = (max: number, what: string) =>
  z.preprocess(blank, z.string().trim().max(max, `Keep ${what} under ${max} characters.`).optional());

/**
 * `POST /api/runs/:id/readings` (JSON, or the fields of a multipart form beside `file`): one bench
 * reading. Which numbers are required follows the input form: `value` for a direct reading,
 * `divisions` and `perDivision` for one read off an oscilloscope's graticule.
 */
export const readingCreateSchema = z
  .object({
    quantity: z.enum(READING_QUANTITIES, `Choose ${READING_QUANTITIES.join(", ")}.`),
    form: z.enum(READING_FORMS, `Choose ${READING_FORMS.join(", ")}.`),
    value: positive("The value"),
    divisions: positive("The number of divisions"),
    perDivision: positive("The scale per division"),
    measureName: z.preprocess(
      blank,
      z
        .string()
        .trim()
        .regex(/^[A-Za-z_][A-Za-z0-9_.]{0,99}$/, "Name a measure of the run (letters, digits, _ and .).")
        .optional(),
    ),
    node: text(100, "the node"),
    note: text(MAX_READING_NOTE_CHARS, "the note"),
  })
  .superRefine((r, ctx) => {
    if (!FORMS_OF[r.quantity].includes(r.form)) {
      ctx.addIssue({
        code: "custom",
        path: ["form"],
        message: `A ${r.quantity} is entered as ${FORMS_OF[r.quantity].join(" or ")}.`,
      });
      return;
    }
    if (r.form === "divisions") {
      if (r.divisions === undefined)
        ctx.addIssue({ code: "custom", path: ["divisions"], message: "Enter the number of divisions." });
      if (r.perDivision === undefined)
        ctx.addIssue({ code: "custom", path: ["perDivision"], message: "Enter the scale per division." });
    } else if (r.value === undefined) {
      ctx.addIssue({ code: "custom", path: ["value"], message: "Enter the value the bench showed." });
    }
  });
export type ReadingCreateInput = z.output<typeof readingCreateSchema>;

export const readingParamsSchema = z.object({
  id: z.uuid().describe("the run's id"),
  readingId: z.uuid().describe("the reading's id"),
});
