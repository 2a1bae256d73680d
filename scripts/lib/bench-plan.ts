import { DEFAULT_AQLS, DEFAULT_LEVEL, buildLotPlan } from "@/lib/lots/plan";
import type { StoredSamplingPlan } from "@/db/schema/lots";

/**
 * The sampling plan a benchmark's generated lot stores: the app's own plan for that lot size at the
 * default level and AQLs, every unit inspected (the benchmarks grade every unit they make). An
 * empty or partial plan here made the lot list of a benchmark workspace answer 500, because the
 * running verdict reads each severity's Ac/Re.
 */
export function benchLotPlan(lotSize: number, switchingReason: string): StoredSamplingPlan {
  return buildLotPlan({ lotSize, level: DEFAULT_LEVEL, aqls: DEFAULT_AQLS, severity: "normal", inspectAll: true, switchingReason });
}
