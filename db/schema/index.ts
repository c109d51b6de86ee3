export * from "./accounts";
export * from "./boards";
export * from "./proposals";
export * from "./reviews";
export * from "./decisions";
export * from "./orbit-files";
export * from "./coverage";
export * from "./responses";
