export * from "./enums";
export * from "./teams";
export * from "./sites";
export * from "./auth";
export * from "./sync";
export * from "./reports";
export * from "./plan";
