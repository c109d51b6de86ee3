import { requireUser } from "@/lib/auth/session";
import { clientAddress } from "@/lib/auth/options";
import { createBoard, listBoards } from "@/lib/dal/boards";
import { json, readJson, route } from "@/lib/http/api";
import { createBoardSchema } from "@/lib/validation/accounts";

export const GET = route(async () => {
  const user = await requireUser();
  return json({ boards: await listBoards(user) });
});

export const POST = route(async (request) => {
  const user = await requireUser();
  const input = await readJson(request, createBoardSchema, 16 * 1024);
  return json(await createBoard(user, input, { ipAddress: clientAddress(request.headers) }), 201);
});
