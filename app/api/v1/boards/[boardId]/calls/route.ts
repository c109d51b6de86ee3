import { requireUser } from "@/lib/auth/session";
import { createCall, listCalls } from "@/lib/dal/calls";
import { json, readJson, route } from "@/lib/http/api";
import { callInputSchema } from "@/lib/validation/dossier";

export const GET = route(async (_request, { boardId }) => {
  const user = await requireUser();
  return json({ calls: await listCalls(user, boardId!) });
});

export const POST = route(async (request, { boardId }) => {
  const user = await requireUser();
  const input = await readJson(request, callInputSchema, 64 * 1024);
  return json({ call: await createCall(user, boardId!, input) }, 201);
});
