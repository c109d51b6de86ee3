import { requireUser } from "@/lib/auth/session";
import { listDispositions, recordDisposition } from "@/lib/dal/responses";
import { json, readJson, route } from "@/lib/http/api";
import { dispositionInput } from "@/lib/validation/responses";

export const GET = route(async (_request, { boardId, itemId }) => {
  const user = await requireUser();
  return json({ history: await listDispositions(user, boardId!, itemId!) });
});

export const POST = route(async (request, { boardId, itemId }) => {
  const user = await requireUser();
  const input = await readJson(request, dispositionInput, 16 * 1024);
  return json({ item: await recordDisposition(user, boardId!, itemId!, input) }, 201);
});
