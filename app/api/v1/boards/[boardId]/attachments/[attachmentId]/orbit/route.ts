import { requireUser } from "@/lib/auth/session";
import { getOrbitFile } from "@/lib/dal/orbit-files";
import { json, route } from "@/lib/http/api";
import { SCREENING_CAUTION } from "@/lib/orbit";

/** What the server read from an orbit-file attachment: parsed file and derived orbits, or the line it stopped at. */
export const GET = route(async (_request, { boardId, attachmentId }) => {
  const user = await requireUser();
  return json({ orbitFile: await getOrbitFile(user, boardId!, attachmentId!), caution: SCREENING_CAUTION });
});
