export * from "./auth";
export * from "./shops";
export * from "./builds";
