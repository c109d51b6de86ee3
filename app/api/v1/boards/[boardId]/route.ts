import { requireUser } from "@/lib/auth/session";
import { clientAddress } from "@/lib/auth/options";
import { getBoard, updateBoard } from "@/lib/dal/boards";
import { json, readJson, route } from "@/lib/http/api";
import { updateBoardSchema } from "@/lib/validation/accounts";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  return json(await getBoard(user, params.boardId ?? ""));
});

export const PATCH = route(async (request, params) => {
  const user = await requireUser();
  const input = await readJson(request, updateBoardSchema, 16 * 1024);
  return json(await updateBoard(user, params.boardId ?? "", input, { ipAddress: clientAddress(request.headers) }));
});
