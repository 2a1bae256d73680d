/** The seeded generator tests and benches share; it lives in lib/random.ts with the others. */
export { mulberry32 } from "@/lib/random";
