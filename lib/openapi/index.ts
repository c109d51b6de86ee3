import packageJson from "@/package.json";
import { buildOpenApiDocument, type ApiOperation } from "./registry";
import { systemOperations } from "./operations/system";
import { accountOperations } from "./operations/accounts";
import { dossierOperations } from "./operations/dossiers";
import { requirementOperations } from "./operations/requirements";
import { reviewOperations } from "./operations/review";
import { decisionOperations } from "./operations/decisions";
import { orbitFileOperations } from "./operations/orbit-files";
import { stationOperations } from "./operations/stations";
import { reportOperations } from "./operations/reports";
import { responseOperations } from "./operations/responses";
import { meetingOperations } from "./operations/meetings";

/** Every /api/v1 operation. Each feature area adds its list here. */
export const apiOperations: ApiOperation[] = [
  ...systemOperations,
  ...accountOperations,
  ...dossierOperations,
  ...requirementOperations,
  ...reviewOperations,
  ...decisionOperations,
  ...orbitFileOperations,
  ...stationOperations,
  ...reportOperations,
  ...responseOperations,
  ...meetingOperations,
];

export function openApiDocument() {
  return buildOpenApiDocument(apiOperations, packageJson.version);
}
