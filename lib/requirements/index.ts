export * from "./types";
export * from "./registry";
