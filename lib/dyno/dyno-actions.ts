"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import { DatalogAnalysisSchema, DatalogRefSchema } from "@/lib/validations/datalogs";

import { analyseDatalog, verifyBuildWithDatalog } from "./dyno-commands";

/** The dyno screen's "Analyse the pull": `{ analysis, series }`; a bad mapping names its fields. */
export const analyseDatalogAction = memberAction(DatalogAnalysisSchema, (m, input) =>
  analyseDatalog(m, input),
);

/** The dyno screen's "Mark verified": `{ build }` as verified, the log marked with it. */
export const verifyDatalogAction = memberAction(DatalogRefSchema, async (m, input) => {
  const out = await verifyBuildWithDatalog(m, input);
  revalidatePath(`/builds/${out.build.id}`);
  revalidatePath(`/builds/${out.build.id}/dyno`);
  revalidatePath("/builds");
  return out;
});
