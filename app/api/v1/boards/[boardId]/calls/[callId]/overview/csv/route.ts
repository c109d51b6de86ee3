import { requireUser } from "@/lib/auth/session";
import { streamCallOverviewCsv } from "@/lib/dal/reviews";
import { parseWith, route, searchParamsObject } from "@/lib/http/api";
import { overviewCsvQuerySchema } from "@/lib/validation/review";

// The file is streamed as it is produced (header, batches of rows, the screening notice last).
export const GET = route(async (request, params) => {
  const user = await requireUser();
  const query = parseWith(overviewCsvQuerySchema, searchParamsObject(request), 400);
  const { filename, stream } = await streamCallOverviewCsv(user, params.boardId ?? "", params.callId ?? "", query);
  return new Response(stream, {
    status: 200,
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"`, "cache-control": "no-store" },
  });
});
