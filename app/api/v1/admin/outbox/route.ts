import { requireUser } from "@/lib/auth/session";
import { listOutbox } from "@/lib/dal/outbox";
import { json, parseWith, route, searchParamsObject } from "@/lib/http/api";
import { outboxListQuery } from "@/lib/validation/decisions";

export const GET = route(async (request) => {
  const user = await requireUser();
  const query = parseWith(outboxListQuery, searchParamsObject(request), 400);
  return json(await listOutbox(user, query));
});
