-- Units that were still waiting (or on a bench) when their lot was decided leave the queue for
-- good, as decideLot now does (lib/lots/lots.ts): status "not_graded", no lease.
UPDATE "units" u
SET "status" = 'not_graded', "lease_holder_id" = NULL, "lease_expires_at" = NULL, "claimed_at" = NULL, "updated_at" = now()
FROM "lots" l
WHERE l."id" = u."lot_id" AND l."status" = 'decided' AND u."status" IN ('queued', 'on_bench');
