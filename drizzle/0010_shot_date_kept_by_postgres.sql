-- A shot's stored date (shot.shot_date, and its clip's upload time shot.clip_created_at), kept by
-- PostgreSQL on every write that can change it (docs/decisions/173-stored-shot-date.md). Functions,
-- triggers and a backfill, which drizzle-kit cannot express.
--
-- THE rule of a shot's date (docs/decisions/121-shot-date.md; server/entities/shot/date.ts holds the
-- same rule for a row already read): the date of the clip's session, else the day the clip was
-- uploaded, by UTC.
CREATE FUNCTION shot_date_rule(session_date date, clip_uploaded timestamptz) RETURNS date
  LANGUAGE sql IMMUTABLE PARALLEL SAFE
  AS $$ SELECT coalesce(session_date, (clip_uploaded AT TIME ZONE 'UTC')::date) $$;--> statement-breakpoint

-- Existing shots.
UPDATE shot SET clip_created_at = c.created_at, shot_date = shot_date_rule(s.date, c.created_at)
  FROM clip c LEFT JOIN training_session s ON s.id = c.session_id
  WHERE c.id = shot.clip_id;--> statement-breakpoint
-- The indexes on the two columns were built before they were filled (0009): rebuild them compact.
REINDEX INDEX shot_team_newest_idx;--> statement-breakpoint
REINDEX INDEX shot_team_player_idx;--> statement-breakpoint

-- A shot made, or moved to another clip, takes its clip's upload time and date. Any write to the
-- two columns themselves is recomputed too, so nothing else can set them.
CREATE FUNCTION shot_take_date() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  SELECT c.created_at, shot_date_rule(s.date, c.created_at) INTO NEW.clip_created_at, NEW.shot_date
    FROM clip c LEFT JOIN training_session s ON s.id = c.session_id
    WHERE c.id = NEW.clip_id;
  RETURN NEW;
END $$;--> statement-breakpoint
CREATE TRIGGER shot_take_date BEFORE INSERT OR UPDATE OF clip_id, shot_date, clip_created_at ON shot
  FOR EACH ROW EXECUTE FUNCTION shot_take_date();--> statement-breakpoint

-- A clip moved to another session (or out of one, as when its session is deleted): its shots
-- take the new date (through shot_take_date).
CREATE FUNCTION clip_date_to_shots() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  UPDATE shot SET shot_date = shot_date WHERE clip_id = NEW.id;
  RETURN NULL;
END $$;--> statement-breakpoint
CREATE TRIGGER clip_date_to_shots AFTER UPDATE OF session_id, created_at ON clip
  FOR EACH ROW WHEN (OLD.session_id IS DISTINCT FROM NEW.session_id OR OLD.created_at IS DISTINCT FROM NEW.created_at)
  EXECUTE FUNCTION clip_date_to_shots();--> statement-breakpoint

-- A session's date corrected: the shots of its clips follow.
CREATE FUNCTION session_date_to_shots() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  UPDATE shot SET shot_date = shot_date WHERE clip_id IN (SELECT id FROM clip WHERE session_id = NEW.id);
  RETURN NULL;
END $$;--> statement-breakpoint
CREATE TRIGGER session_date_to_shots AFTER UPDATE OF date ON training_session
  FOR EACH ROW WHEN (OLD.date IS DISTINCT FROM NEW.date)
  EXECUTE FUNCTION session_date_to_shots();
