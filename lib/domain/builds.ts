/** The build sheet's vocabulary: statuses, the moves between them, kit roles and labels. */

export const BUILD_STATUSES = [
  "draft",
  "sized",
  "quoted",
  "ordered",
  "fitted",
  "verified",
] as const;
export type BuildStatus = (typeof BUILD_STATUSES)[number];

export const KIT_ROLES = [
  "injector",
  "pump",
  "regulator",
  "feed-line",
  "return-line",
  "filter",
  "sensor",
] as const;
export type KitRole = (typeof KIT_ROLES)[number];
export const KIT_ROLE_LABELS: Record<KitRole, string> = {
  injector: "injectors",
  pump: "fuel pump",
  regulator: "regulator",
  "feed-line": "feed line",
  "return-line": "return line",
  filter: "filter",
  sensor: "ethanol content sensor",
};
/** A catalog part chosen for a build, with the figures it was chosen on. */
export interface ChosenPart {
  role: KitRole;
  partId: string;
  sku: string;
  name: string;
  quantity: number;
}

/** Status moves: forward one step, or back to draft for a rework. */
export const STATUS_NEXT: Record<BuildStatus, readonly BuildStatus[]> = {
  draft: ["sized"],
  sized: ["draft", "quoted"],
  quoted: ["draft", "ordered"],
  ordered: ["fitted"],
  fitted: ["verified"],
  verified: ["draft"],
};

export const STATUS_LABELS: Record<BuildStatus, string> = {
  draft: "Draft",
  sized: "Sized",
  quoted: "Quoted",
  ordered: "Ordered",
  fitted: "Fitted",
  verified: "Verified",
};
