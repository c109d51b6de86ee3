import { z } from "zod";
import { defineOperations } from "../registry";
import { reportQuery } from "@/lib/validation/reports";

const version = "/api/v1/boards/{boardId}/proposals/{proposalId}/versions/{number}";

export const reportOperations = defineOperations([
  {
    method: "get",
    path: `${version}/report`,
    operationId: "getReviewReport",
    summary:
      "The review report of a version: scores by criterion, review items with their discussion, the orbit checks with their flags, hints and requirement verdicts, and the changes since the previous version. HTML by default, PDF or JSON by ?format= or the Accept header. Readers: the chair; the authors once the version is decided; the version's reviewers when the board shares review items after submission and theirs is submitted. Reviewers are named for the chair only.",
    tag: "reports",
    access: "signed-in",
    query: reportQuery,
    mediaTypes: ["text/html", "application/pdf", "application/json"],
    response: z.object({ report: z.record(z.string(), z.unknown()) }),
  },
]);
