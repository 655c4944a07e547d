CREATE TABLE "shot_tally" (
	"team_id" text NOT NULL,
	"player_id" text,
	"stick_id" uuid,
	"shot_type" text NOT NULL,
	"published" boolean NOT NULL,
	"n" integer NOT NULL,
	CONSTRAINT "shot_tally_key" UNIQUE NULLS NOT DISTINCT("team_id","player_id","stick_id","shot_type","published")
);
--> statement-breakpoint
CREATE INDEX "shot_team_unpublished_idx" ON "shot" USING btree ("team_id","shot_date" DESC NULLS FIRST,"clip_created_at" DESC NULLS FIRST,"created_at" DESC NULLS FIRST,"id") WHERE published_at is null;--> statement-breakpoint
-- Below: the tally's triggers and first fill (docs/decisions/190-shot-tally.md), written by hand
-- because drizzle-kit cannot express functions, triggers or data. Same pattern as 0010 and 0015.

-- No shot may change between the first fill and the triggers taking over.
LOCK TABLE shot IN SHARE ROW EXCLUSIVE MODE;--> statement-breakpoint

-- One statement's net change per key, applied in key order (so two writers lock the rows they
-- share in the same order) and inside the writing transaction (so the tally commits, or rolls
-- back, with the shots). Statement triggers with transition tables: a statement writing 50,000
-- shots makes one pass, not 50,000.
CREATE OR REPLACE FUNCTION shot_tally_apply() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    INSERT INTO shot_tally AS t (team_id, player_id, stick_id, shot_type, published, n)
      SELECT team_id, player_id, stick_id, shot_type, published_at IS NOT NULL, count(*) FROM new_rows
      GROUP BY 1, 2, 3, 4, 5 ORDER BY 1, 2, 3, 4, 5
      ON CONFLICT ON CONSTRAINT shot_tally_key DO UPDATE SET n = t.n + excluded.n;
  ELSIF TG_OP = 'DELETE' THEN
    INSERT INTO shot_tally AS t (team_id, player_id, stick_id, shot_type, published, n)
      SELECT team_id, player_id, stick_id, shot_type, published_at IS NOT NULL, -count(*) FROM old_rows
      GROUP BY 1, 2, 3, 4, 5 ORDER BY 1, 2, 3, 4, 5
      ON CONFLICT ON CONSTRAINT shot_tally_key DO UPDATE SET n = t.n + excluded.n;
  ELSE
    INSERT INTO shot_tally AS t (team_id, player_id, stick_id, shot_type, published, n)
      SELECT team_id, player_id, stick_id, shot_type, published, sum(d) FROM (
        SELECT team_id, player_id, stick_id, shot_type, published_at IS NOT NULL AS published, 1 AS d FROM new_rows
        UNION ALL
        SELECT team_id, player_id, stick_id, shot_type, published_at IS NOT NULL, -1 FROM old_rows
      ) c
      GROUP BY 1, 2, 3, 4, 5 HAVING sum(d) <> 0 ORDER BY 1, 2, 3, 4, 5
      ON CONFLICT ON CONSTRAINT shot_tally_key DO UPDATE SET n = t.n + excluded.n;
  END IF;
  RETURN NULL;
END $$;--> statement-breakpoint

INSERT INTO shot_tally (team_id, player_id, stick_id, shot_type, published, n)
  SELECT team_id, player_id, stick_id, shot_type, published_at IS NOT NULL, count(*) FROM shot GROUP BY 1, 2, 3, 4, 5;--> statement-breakpoint

CREATE TRIGGER shot_tally_insert AFTER INSERT ON shot REFERENCING NEW TABLE AS new_rows
  FOR EACH STATEMENT EXECUTE FUNCTION shot_tally_apply();--> statement-breakpoint
CREATE TRIGGER shot_tally_update AFTER UPDATE ON shot REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
  FOR EACH STATEMENT EXECUTE FUNCTION shot_tally_apply();--> statement-breakpoint
CREATE TRIGGER shot_tally_delete AFTER DELETE ON shot REFERENCING OLD TABLE AS old_rows
  FOR EACH STATEMENT EXECUTE FUNCTION shot_tally_apply();
