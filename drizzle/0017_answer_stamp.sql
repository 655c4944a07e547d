CREATE TABLE "answer_change" (
	"team_id" text NOT NULL,
	"xid" bigint NOT NULL,
	CONSTRAINT "answer_change_team_id_xid_pk" PRIMARY KEY("team_id","xid")
);
--> statement-breakpoint
CREATE TABLE "answer_stamp" (
	"team_id" text PRIMARY KEY NOT NULL,
	"n" bigint NOT NULL
);
--> statement-breakpoint
-- Below: the change stamp's functions and triggers (docs/decisions/192-answer-cache-with-a-change-stamp.md),
-- written by hand because drizzle-kit cannot express functions or triggers. Same pattern as 0016.

-- Folds a team's change rows into its stamp, keeping the sum (what a reader reads) unchanged, so
-- the rows a reader counts stay few. Only one transaction folds a team at a time, and a writer that
-- cannot fold at once simply does not: no writer ever waits here.
CREATE OR REPLACE FUNCTION answer_stamp_fold(team text) RETURNS void LANGUAGE plpgsql AS $$
BEGIN
  IF NOT pg_try_advisory_xact_lock(hashtext('answer_stamp'), hashtext(team)) THEN
    RETURN;
  END IF;
  WITH gone AS (DELETE FROM answer_change WHERE team_id = team RETURNING 1)
  INSERT INTO answer_stamp AS s (team_id, n) SELECT team, count(*) FROM gone
    ON CONFLICT (team_id) DO UPDATE SET n = s.n + excluded.n;
END $$;--> statement-breakpoint

-- One row per team the statement touched and writing transaction, inside that transaction (so it
-- commits, or rolls back, with the write). Each transaction adds its own row: writers do not lock
-- a shared row, so none waits for another's commit. TG_ARGV[0] names the table's team column. About
-- one write in 64 folds the team's rows (answer_stamp_fold).
CREATE OR REPLACE FUNCTION answer_changed() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  teams text[];
  t text;
BEGIN
  IF TG_OP = 'INSERT' THEN
    EXECUTE format('SELECT array_agg(DISTINCT %I) FROM new_rows', TG_ARGV[0]) INTO teams;
  ELSIF TG_OP = 'DELETE' THEN
    EXECUTE format('SELECT array_agg(DISTINCT %I) FROM old_rows', TG_ARGV[0]) INTO teams;
  ELSE
    EXECUTE format('SELECT array_agg(DISTINCT x) FROM (SELECT %1$I AS x FROM new_rows UNION SELECT %1$I FROM old_rows) c', TG_ARGV[0]) INTO teams;
  END IF;
  FOREACH t IN ARRAY coalesce(teams, '{}') LOOP
    INSERT INTO answer_change (team_id, xid) VALUES (t, pg_current_xact_id()::text::bigint) ON CONFLICT DO NOTHING;
    IF FOUND AND random() < 1.0 / 64 THEN
      PERFORM answer_stamp_fold(t);
    END IF;
  END LOOP;
  RETURN NULL;
END $$;--> statement-breakpoint

-- A person's name shows in any team they were ever part of (clips they uploaded, shots shared by
-- them): a change of a name is a change for every team ("*", which every team's stamp counts).
CREATE OR REPLACE FUNCTION answer_changed_name() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF EXISTS (SELECT 1 FROM new_rows n JOIN old_rows o ON o.id = n.id WHERE n.name IS DISTINCT FROM o.name) THEN
    INSERT INTO answer_change (team_id, xid) VALUES ('*', pg_current_xact_id()::text::bigint) ON CONFLICT DO NOTHING;
    IF FOUND AND random() < 1.0 / 64 THEN
      PERFORM answer_stamp_fold('*');
    END IF;
  END IF;
  RETURN NULL;
END $$;--> statement-breakpoint

-- Every table the hot reads read (tests/api/answer-cache.test.ts derives the list from their statements).
DO $$
DECLARE
  tbl text[];
BEGIN
  FOREACH tbl SLICE 1 IN ARRAY ARRAY[
    ['clip', 'team_id'], ['shot', 'team_id'], ['shot_result', 'team_id'], ['shot_share', 'team_id'],
    ['training_session', 'team_id'], ['stick', 'team_id'], ['bench_test', 'team_id'], ['member', 'organization_id']
  ] LOOP
    EXECUTE format('CREATE TRIGGER answer_change_insert AFTER INSERT ON %I REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION answer_changed(%L)', tbl[1], tbl[2]);
    EXECUTE format('CREATE TRIGGER answer_change_update AFTER UPDATE ON %I REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION answer_changed(%L)', tbl[1], tbl[2]);
    EXECUTE format('CREATE TRIGGER answer_change_delete AFTER DELETE ON %I REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION answer_changed(%L)', tbl[1], tbl[2]);
  END LOOP;
END $$;--> statement-breakpoint

CREATE TRIGGER answer_change_name AFTER UPDATE ON "user" REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
  FOR EACH STATEMENT EXECUTE FUNCTION answer_changed_name();
