DROP INDEX "shot_team_player_idx";--> statement-breakpoint
ALTER TABLE "shot" ADD COLUMN "shot_date" date DEFAULT current_date NOT NULL;--> statement-breakpoint
ALTER TABLE "shot" ADD COLUMN "clip_created_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
CREATE INDEX "clip_session_idx" ON "clip" USING btree ("session_id");--> statement-breakpoint
CREATE INDEX "shot_team_newest_idx" ON "shot" USING btree ("team_id","shot_date" DESC NULLS FIRST,"clip_created_at" DESC NULLS FIRST,"created_at" DESC NULLS FIRST,"id","player_id");--> statement-breakpoint
CREATE INDEX "shot_team_player_idx" ON "shot" USING btree ("team_id","player_id","shot_date" DESC NULLS FIRST,"clip_created_at" DESC NULLS FIRST,"created_at" DESC NULLS FIRST,"id");