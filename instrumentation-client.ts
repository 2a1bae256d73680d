/**
 * Runs in the browser before the app's own code (Next.js loads it ahead of hydration). zod checks
 * once whether it may compile validators with `new Function`; under the app's Content-Security-
 * Policy (no 'unsafe-eval') that probe is refused and reported as a violation, although zod then
 * works without it. Telling zod up front to validate without compiling avoids the probe.
 */
import { z } from "zod";

z.config({ jitless: true });
