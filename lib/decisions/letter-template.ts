import "server-only";
import { authorize } from "@/lib/auth/policy";
import type { SessionUser } from "@/lib/auth/session";
import { isUuid } from "@/lib/dal/boards";
import { boardLetterTemplate, writeLetterTemplate } from "@/lib/dal/letter-templates";
import { inTransaction } from "@/lib/dal/transaction";
import { notFound } from "@/lib/errors";
import { checkLetter } from "./issue";
import { MERGE_FIELDS, type MergeFieldInfo } from "./merge-fields";
import { DEFAULT_LETTER_TEMPLATE } from "./template";

export async function getLetterTemplate(
  user: SessionUser,
  boardId: string,
): Promise<{ template: Record<string, unknown>; isDefault: boolean; mergeFields: readonly MergeFieldInfo[]; boardName: string }> {
  const board = await boardForManage(user, boardId);
  return {
    template: board.letterTemplate ?? DEFAULT_LETTER_TEMPLATE,
    isDefault: board.letterTemplate === null,
    mergeFields: MERGE_FIELDS,
    boardName: board.name,
  };
}

export async function saveLetterTemplate(
  user: SessionUser,
  boardId: string,
  template: Record<string, unknown> | null,
): Promise<{ saved: true; isDefault: boolean }> {
  await boardForManage(user, boardId);
  if (template) checkLetter(template);
  await inTransaction((tx) => writeLetterTemplate(tx, user, boardId, template));
  return { saved: true, isDefault: template === null };
}

async function boardForManage(user: SessionUser, boardId: string) {
  if (!isUuid(boardId)) throw notFound("That board");
  const { board, role } = await boardLetterTemplate(boardId, user.id);
  if (!board) throw notFound("That board");
  authorize(user, "board.manage", { role }, "That board");
  return board;
}
