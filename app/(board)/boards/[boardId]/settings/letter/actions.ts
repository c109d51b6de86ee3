"use server";
import { z } from "zod";
import { action } from "@/lib/actions/action";
import { saveLetterTemplate } from "@/lib/decisions";
import { letterDocument } from "@/lib/validation/decisions";

/** Saves the board's decision letter template; `template: null` goes back to VisViva's default. */
export const saveLetterTemplateAction = action(z.object({ boardId: z.uuid(), template: letterDocument.nullable() }), async ({ boardId, template }, user) =>
  saveLetterTemplate(user, boardId, template),
);
