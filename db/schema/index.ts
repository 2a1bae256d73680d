export * from "./core";
