import { requireUser } from "@/lib/auth/session";
import { getBoard } from "@/lib/dal/boards";
import { getMeetingMinutes } from "@/lib/dal/meetings";
import { route } from "@/lib/http/api";
import { renderMinutesPdf } from "@/lib/pdf/minutes";

export const GET = route(async (_request, { boardId, callId }) => {
  const user = await requireUser();
  const minutes = await getMeetingMinutes(user, boardId!, callId!);
  const board = await getBoard(user, boardId!);
  const pdf = await renderMinutesPdf({ ...minutes, boardName: board.name });
  const slug =
    minutes.callTitle
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "") || "call";
  return new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${slug}-panel-minutes.pdf"`,
      "cache-control": "private, no-store",
    },
  });
});
