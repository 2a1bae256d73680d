import { z } from "zod";

/** POST /api/suggestion-models: nothing to choose yet; unknown fields are refused. */
export const trainRequestSchema = z.strictObject({});
