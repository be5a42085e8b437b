import "server-only";

import type { z } from "zod";

import {
  buildStatusFacts,
  getBuild,
  getRevision,
  createBuild as insertBuild,
  saveBuild as saveBuildRow,
  type StatusCheck,
} from "@/db/queries/builds";
import { getCustomer } from "@/db/queries/customers";
import { unitSystemOf } from "@/db/queries/preferences";
import { getVehicle } from "@/db/queries/vehicles";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import type { FuelSystemInput } from "@/lib/calc";
import { formatValue } from "@/lib/calc/quantities";
import {
  FUEL_CHOICE_LABELS,
  refusedMove,
  vehicleText,
  type BuildStatus,
} from "@/lib/domain/builds";
import { Invalid, InvalidTransition, NotFound } from "@/lib/domain/errors";
import { shopToday } from "@/lib/shop/shop-zone";
import { DEFAULT_DRIVE_TYPE } from "@/lib/sizing/effective-inputs";
import { shopSizingSettings } from "@/lib/sizing/shop-sizing";
import type {
  BuildCreateSchema,
  BuildDraft,
  BuildRefSchema,
  BuildSaveSchema,
  RevisionRestoreSchema,
} from "@/lib/validations/builds";

import { buildData, saved, type BuildResult } from "./build-data";
import { draftInputs, newBuildInputs } from "./defaults";
import { stableJson } from "./diff";
import {
  readStoredInputs,
  sizeForSave,
  storedSizingSettings,
  type SizedInputs,
} from "./stored-inputs";

/** A new build sheet for one of the shop's customers, sized on the server (default inputs if none). */
export async function createBuild(
  m: Member,
  input: z.output<typeof BuildCreateSchema>,
): Promise<BuildResult> {
  authorize(m, "builds:write");
  if (!(await getCustomer(m.shopId, input.customerId)))
    throw Invalid.field("customerId", "That customer is not in this shop");
  const b = await insertBuild(m.shopId, m.user.id, {
    customerId: input.customerId,
    title: input.title,
    vehicle: input.vehicle,
    sized: sizeForSave(await shopSizingSettings(m.shopId), input.inputs ?? newBuildInputs()),
  });
  return { build: buildData(b) };
}

/**
 * The counter's draft build from a caller's goal: the customer's vehicle (picked, or added in the
 * same transaction), the engine, power goal and fuel set into the starting inputs, in
 * `needs_sizing` for a tuner to size (it is sized once with the shop's settings, so the record
 * is whole; the status says nobody has checked it). Who may: `builds:draft` (the counter too).
 */
export async function createDraftBuild(m: Member, input: BuildDraft): Promise<BuildResult> {
  authorize(m, "builds:draft");
  if (!(await getCustomer(m.shopId, input.customerId)))
    throw Invalid.field("customerId", "That customer is not in this shop");
  let vehicle: string | undefined;
  if (input.vehicleId) {
    const v = await getVehicle(m.shopId, input.vehicleId);
    if (!v || v.customerId !== input.customerId)
      throw Invalid.field("vehicleId", "That vehicle is not this customer's");
    vehicle = vehicleText(v);
  } else if (input.newVehicle) vehicle = vehicleText(input.newVehicle);
  const g = input.goal;
  const units = await unitSystemOf(m.user.id, m.shopId);
  const goalText = `${formatValue("power", g.powerKw, units)} ${g.measuredAt === "wheel" ? "at the wheels" : "at the crank"}, ${FUEL_CHOICE_LABELS[g.fuel]}`;
  const b = await insertBuild(m.shopId, m.user.id, {
    customerId: input.customerId,
    title: (input.title || `${vehicle ?? "New build"}: ${goalText}`).slice(0, 120),
    vehicle,
    vehicleId: input.vehicleId,
    newVehicle: input.newVehicle,
    status: "needs_sizing",
    note: `Goal taken by ${m.user.name}: ${goalText}`.slice(0, 500),
    sized: sizeForSave(await shopSizingSettings(m.shopId), draftInputs(g)),
  });
  return { build: buildData(b) };
}

/**
 * Saves the build sheet from the version the edit started from: only the fields sent change, the
 * inputs are validated and sized again on the server with the shop's settings of today (so
 * sending the stored inputs back re-sizes a build made under older settings), a status moves
 * only along STATUS_NEXT and only when its precondition holds (lib/domain/builds.ts#statusMoves:
 * the build's quotes, its verified dyno log), checked in the save's transaction — else 422
 * invalid_transition saying what is missing. A stale version → Conflict (409) carrying the
 * current build; nothing is overwritten.
 */
export async function saveBuild(
  m: Member,
  input: z.output<typeof BuildSaveSchema>,
): Promise<BuildResult> {
  authorize(m, "builds:write");
  const row = await getBuild(m.shopId, input.id);
  if (!row) throw new NotFound("That build");
  const { id, version, inputs, ...fields } = input;
  const settings = await shopSizingSettings(m.shopId);
  const sized = inputs ? sizeForSave(settings, sameDriveType(row.build, inputs)) : undefined;
  return saved(
    saveBuildRow(
      m.shopId,
      id,
      m.user.id,
      version,
      {
        ...fields,
        // Inputs equal to the stored ones, sized with the same settings, change nothing: they are
        // not written (with nothing else changed the build keeps its version and no revision).
        ...(sized && !sameSizing(row.build, sized) ? { sized } : {}),
      },
      undefined,
      input.status ? statusRule(m.shopId, id, input.status) : undefined,
    ),
  );
}

/**
 * A build that names no drive type is sized as DEFAULT_DRIVE_TYPE: the editor's select shows
 * that default, so a save sending it back states nothing new and the stored inputs keep no key.
 */
function sameDriveType(
  stored: Parameters<typeof readStoredInputs>[0],
  inputs: FuelSystemInput,
): FuelSystemInput {
  if (inputs.target?.driveType !== DEFAULT_DRIVE_TYPE) return inputs;
  let before: FuelSystemInput;
  try {
    before = readStoredInputs(stored);
  } catch {
    return inputs;
  }
  if (before.target.driveType !== undefined) return inputs;
  const target = { ...inputs.target };
  delete target.driveType;
  return { ...inputs, target };
}

/** The stored build already holds these inputs, sized with these settings. */
function sameSizing(
  stored: Parameters<typeof readStoredInputs>[0] & { sizingSettings: unknown },
  sized: SizedInputs,
): boolean {
  try {
    return (
      stableJson(readStoredInputs(stored)) === stableJson(sized.inputs) &&
      stableJson(storedSizingSettings(stored)) === stableJson(sized.sizingSettings)
    );
  } catch {
    return false;
  }
}

/** "Power step": a new build for the same car, starting from this build's inputs. */
export async function copyBuild(
  m: Member,
  input: z.output<typeof BuildRefSchema>,
): Promise<BuildResult> {
  authorize(m, "builds:write");
  const row = await getBuild(m.shopId, input.id);
  if (!row) throw new NotFound("That build");
  const b = await insertBuild(m.shopId, m.user.id, {
    customerId: row.build.customerId,
    title: `${row.build.title} — next step`.slice(0, 120),
    vehicle: row.build.vehicle ?? undefined,
    sized: sizeForSave(await shopSizingSettings(m.shopId), readStoredInputs(row.build)),
  });
  return { build: buildData(b) };
}

/**
 * Restores an earlier revision's inputs and parts as a new revision, sized with today's library
 * and today's shop settings (the revision itself keeps the figures it was saved with).
 */
export async function restoreRevision(
  m: Member,
  input: z.output<typeof RevisionRestoreSchema>,
): Promise<BuildResult> {
  authorize(m, "builds:write");
  const rev = await getRevision(m.shopId, input.buildId, input.version);
  if (!rev) throw new NotFound("That revision");
  return saved(
    saveBuildRow(m.shopId, input.buildId, m.user.id, input.currentVersion, {
      sized: sizeForSave(await shopSizingSettings(m.shopId), readStoredInputs(rev)),
      parts: rev.parts,
      note: `Restored from version ${input.version}`,
    }),
  );
}

/** Refuses a move to `to` that the workflow or its precondition does not allow now. */
function statusRule(shopId: string, buildId: string, to: BuildStatus): StatusCheck {
  return async (from, tx) => {
    const why = refusedMove(
      from,
      to,
      await buildStatusFacts(shopId, buildId, await shopToday(shopId), tx),
    );
    if (why) throw new InvalidTransition(why);
  };
}
