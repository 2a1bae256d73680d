export * from "./core";
export * from "./lots";
