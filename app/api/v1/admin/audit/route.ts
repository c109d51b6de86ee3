import { requireUser } from "@/lib/auth/session";
import { listAuditLog } from "@/lib/dal/audit";
import { json, parseWith, route, searchParamsObject } from "@/lib/http/api";
import { auditQuerySchema } from "@/lib/validation/accounts";

export const GET = route(async (request) => {
  const user = await requireUser();
  const query = parseWith(auditQuerySchema, searchParamsObject(request), 400);
  return json(await listAuditLog(user, query));
});
