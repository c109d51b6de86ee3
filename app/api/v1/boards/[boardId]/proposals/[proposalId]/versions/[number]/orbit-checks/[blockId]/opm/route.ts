import { requireUser } from "@/lib/auth/session";
import { exportBlockOpm } from "@/lib/dal/orbit-files";
import { parseWith, route } from "@/lib/http/api";
import { opmDownload } from "@/lib/http/opm-download";
import { versionNumberSchema } from "@/lib/validation/dossier";

/** A submitted version's block as a CCSDS OPM (KVN) download. */
export const GET = route(async (_request, { boardId, proposalId, number, blockId }) => {
  const user = await requireUser();
  const n = parseWith(versionNumberSchema, number, 400);
  return opmDownload(await exportBlockOpm(user, boardId!, proposalId!, { version: n, blockId: blockId! }));
});
