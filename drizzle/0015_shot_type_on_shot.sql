ALTER TABLE "shot" ADD COLUMN "shot_type" text DEFAULT 'slap' NOT NULL;--> statement-breakpoint
CREATE INDEX "shot_team_type_idx" ON "shot" USING btree ("team_id","shot_type","shot_date" DESC NULLS FIRST,"clip_created_at" DESC NULLS FIRST,"created_at" DESC NULLS FIRST,"id","player_id");--> statement-breakpoint
-- Below: the backfill and triggers that keep shot.shot_type equal to its clip's shot type
-- (docs/decisions/176-stored-shot-type.md), written by hand because drizzle-kit cannot express
-- functions, triggers or data updates. Same pattern as the stored date (0010, decision 173).

-- Existing shots.
UPDATE shot SET shot_type = c.shot_type FROM clip c WHERE c.id = shot.clip_id AND shot.shot_type <> c.shot_type;--> statement-breakpoint
-- The index was built before the column was filled: rebuild it compact.
REINDEX INDEX shot_team_type_idx;--> statement-breakpoint

-- A shot made, or moved to another clip, takes its clip's upload time, date and shot type in one
-- lookup; a direct write to any of the three is recomputed, so nothing else can set them.
CREATE OR REPLACE FUNCTION shot_take_date() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  SELECT c.created_at, shot_date_rule(s.date, c.created_at), c.shot_type INTO NEW.clip_created_at, NEW.shot_date, NEW.shot_type
    FROM clip c LEFT JOIN training_session s ON s.id = c.session_id
    WHERE c.id = NEW.clip_id;
  RETURN NEW;
END $$;--> statement-breakpoint
DROP TRIGGER shot_take_date ON shot;--> statement-breakpoint
CREATE TRIGGER shot_take_date BEFORE INSERT OR UPDATE OF clip_id, shot_date, clip_created_at, shot_type ON shot
  FOR EACH ROW EXECUTE FUNCTION shot_take_date();--> statement-breakpoint

-- A clip's shot type corrected: its shots follow (through shot_take_date), as they do when the
-- clip moves to another session.
DROP TRIGGER clip_date_to_shots ON clip;--> statement-breakpoint
CREATE TRIGGER clip_date_to_shots AFTER UPDATE OF session_id, created_at, shot_type ON clip
  FOR EACH ROW WHEN (OLD.session_id IS DISTINCT FROM NEW.session_id OR OLD.created_at IS DISTINCT FROM NEW.created_at OR OLD.shot_type IS DISTINCT FROM NEW.shot_type)
  EXECUTE FUNCTION clip_date_to_shots();
