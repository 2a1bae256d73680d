export * from "./iso2859";
export * from "./switching";
