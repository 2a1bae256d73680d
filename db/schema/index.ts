export * from "./core";
export * from "./lots";
export * from "./photos";
export * from "./regions";
export * from "./grading";
export * from "./gallery";
export * from "./suggestions";
export * from "./certificates";
