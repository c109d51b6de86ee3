import { requireUser } from "@/lib/auth/session";
import { exportBlockOpm } from "@/lib/dal/orbit-files";
import { route } from "@/lib/http/api";
import { opmDownload } from "@/lib/http/opm-download";

/** A draft block's orbit as a CCSDS OPM (KVN) download (authors). */
export const GET = route(async (_request, { boardId, proposalId, blockId }) => {
  const user = await requireUser();
  return opmDownload(await exportBlockOpm(user, boardId!, proposalId!, { version: null, blockId: blockId! }));
});
