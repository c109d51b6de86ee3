import { z } from "zod";
import { defineOperations } from "../registry";

const board = "/api/v1/boards/{boardId}";
const proposal = `${board}/proposals/{proposalId}`;

const orbitFileSchema = z.object({
  attachmentId: z.uuid(),
  proposalId: z.uuid(),
  filename: z.string(),
  sha256: z.string(),
  status: z.enum(["parsed", "unparsed"]),
  format: z.enum(["tle", "opm", "omm", "oem"]).nullable(),
  error: z.object({ line: z.number().int().nullable(), message: z.string() }).nullable(),
  file: z
    .record(z.string(), z.unknown())
    .nullable()
    .describe(
      "the parsed file (two-line element sets, or the OPM/OMM/OEM's header, metadata and data; OEM segments keep their first, last and a bounded sample of states and of covariance matrices); null when unparsed",
    ),
  summaries: z
    .array(z.record(z.string(), z.unknown()))
    .describe(
      "per orbit of the file: epoch (and epochUtc for TAI/TT files), frame, osculating (and mean) elements, altitude range, period, sun-synchronous check, the orbit plane of date and in EME2000 (planes), covariance as 1σ per axis (first and last matrix, count)",
    ),
  parsedAt: z.string(),
});

export const orbitFileOperations = defineOperations([
  {
    method: "get",
    path: `${board}/attachments/{attachmentId}/orbit`,
    operationId: "getAttachmentOrbitFile",
    summary:
      "What the server read from an orbit-file attachment (element sets, CCSDS OPM/OMM/OEM in KVN or XML): parsed values and derived orbits, or the line where reading stopped",
    tag: "orbit files",
    access: "signed-in",
    response: z.object({ orbitFile: orbitFileSchema, caution: z.string() }),
    errors: { 404: "No such attachment, not an orbit file, or not visible to you" },
  },
  {
    method: "get",
    path: `${proposal}/orbit-files`,
    operationId: "listProposalOrbitFiles",
    summary: "The orbit files among a proposal's attachments, parsed or not",
    tag: "orbit files",
    access: "signed-in",
    response: z.object({ orbitFiles: z.array(orbitFileSchema), caution: z.string() }),
  },
  {
    method: "get",
    path: `${proposal}/draft/orbit-checks/{blockId}/opm`,
    operationId: "exportDraftBlockOpm",
    summary: "A draft orbit-check block's orbit as a CCSDS OPM (KVN) download (authors)",
    tag: "orbit files",
    access: "signed-in",
    errors: { 404: "No such block in the draft", 422: "The block describes no single orbit (e.g. a transfer)" },
  },
  {
    method: "get",
    path: `${proposal}/versions/{number}/orbit-checks/{blockId}/opm`,
    operationId: "exportVersionBlockOpm",
    summary: "A submitted version's orbit-check block as a CCSDS OPM (KVN) download",
    tag: "orbit files",
    access: "signed-in",
    errors: { 404: "No such version or block", 422: "The block describes no single orbit (e.g. a transfer)" },
  },
]);
