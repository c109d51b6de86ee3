"use server";
import { action } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { updateBoard } from "@/lib/dal/boards";
import { boardSettingsFormSchema } from "@/lib/validation/accounts";

export const updateBoardSettingsAction = action(boardSettingsFormSchema, async ({ boardId, ...settings }, user) =>
  updateBoard(user, boardId, settings, { ipAddress: await actionClientAddress() }),
);
