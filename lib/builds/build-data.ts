import type { CurrentBuild } from "@/db/queries/builds";
import type { Build } from "@/db/schema";
import { Conflict } from "@/lib/domain/errors";

/**
 * A build as commands return it: plain data (times as ISO strings), the same to JSON and actions.
 * Internal columns stay on the server: the kit's basis (`kitBasis`, inputs kept for the kit's
 * ranking) and the search column (`searchText`, kept by the database's triggers).
 */
export type BuildData = Omit<Build, "createdAt" | "updatedAt" | "kitBasis" | "searchText"> & {
  createdAt: string;
  updatedAt: string;
};

/** The build as it is now, as a conflict carries it: with the name of who saved it last. */
export type CurrentBuildData = BuildData & { updatedByName: string | null };

/** What every command that writes a build answers: the build as saved, with its new version. */
export interface BuildResult {
  build: BuildData;
}

export function buildData({ kitBasis: _basis, searchText: _search, ...b }: Build): BuildData {
  return { ...b, createdAt: b.createdAt.toISOString(), updatedAt: b.updatedAt.toISOString() };
}

/**
 * A save's answer as plain data: the build, or a Conflict whose current build is plain data too,
 * so the API and the editor get the same shape.
 */
export async function saved(save: Promise<Build>): Promise<BuildResult> {
  try {
    return { build: buildData(await save) };
  } catch (e) {
    if (e instanceof Conflict && e.current) {
      const { updatedByName, ...b } = e.current as CurrentBuild;
      const current: CurrentBuildData = { ...buildData(b), updatedByName };
      throw new Conflict(e.message, e.code, current);
    }
    throw e;
  }
}
