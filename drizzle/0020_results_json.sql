-- The results are kept as the JSON text they were written as (decision 201): the two columns
-- PostgreSQL derives from them are dropped, the type changed, and both derived again.
ALTER TABLE "shot_result" DROP COLUMN "summary";--> statement-breakpoint
ALTER TABLE "shot_result" DROP COLUMN "results_md5";--> statement-breakpoint
ALTER TABLE "shot_result" ALTER COLUMN "results" SET DATA TYPE json USING "results"::json;--> statement-breakpoint
ALTER TABLE "shot_result" ADD COLUMN "summary" jsonb GENERATED ALWAYS AS (case when json_typeof(results) = 'object' then results::jsonb - 'series' end) STORED;--> statement-breakpoint
ALTER TABLE "shot_result" ADD COLUMN "results_md5" text GENERATED ALWAYS AS (md5(results::text)) STORED;
