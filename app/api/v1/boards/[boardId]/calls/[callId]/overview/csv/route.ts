import { requireUser } from "@/lib/auth/session";
import { getCallOverviewCsv } from "@/lib/dal/reviews";
import { route } from "@/lib/http/api";

export const GET = route(async (_request, params) => {
  const user = await requireUser();
  const { filename, csv } = await getCallOverviewCsv(user, params.boardId ?? "", params.callId ?? "");
  return new Response(csv, {
    status: 200,
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"`, "cache-control": "no-store" },
  });
});
