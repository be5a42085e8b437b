export * from "./auth";
export * from "./shops";
