import { z } from "zod";

import { DatalogMappingSchema } from "@/lib/calc";

/** A dyno log uploaded to a build: the CSV's text (size and type are checked by the route). */
export const DatalogUploadSchema = z.object({
  buildId: z.uuid("Unknown build"),
  /** As the browser named it; kept to a safe set of characters. */
  fileName: z.string().optional(),
  csv: z.string(),
});

/** Analyse a log with this column mapping (remembered for the logger's header set). */
export const DatalogAnalysisSchema = z.object(
  { id: z.uuid("Unknown datalog"), mapping: DatalogMappingSchema },
  { error: "Send { mapping }" },
);

/** Mark the log's build verified with this (analysed) log. */
export const DatalogRefSchema = z.object({ id: z.uuid("Unknown datalog") });
