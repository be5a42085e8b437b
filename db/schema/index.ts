export * from "./auth";
export * from "./shops";
export * from "./builds";
export * from "./catalog";
export * from "./operations";
