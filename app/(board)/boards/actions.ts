"use server";
import { action } from "@/lib/actions/action";
import { actionClientAddress } from "@/lib/auth/page-guard";
import { createBoard } from "@/lib/dal/boards";
import { createBoardSchema } from "@/lib/validation/accounts";

export const createBoardAction = action(createBoardSchema, async (input, user) => createBoard(user, input, { ipAddress: await actionClientAddress() }));
