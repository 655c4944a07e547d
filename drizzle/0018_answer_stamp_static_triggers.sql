-- The change stamp's trigger function with static SQL (docs/decisions/192-answer-cache-with-a-change-stamp.md),
-- written by hand because drizzle-kit cannot express functions. 0017's version built its query
-- with EXECUTE format(…), which PostgreSQL parses and plans on every call. The database's CPU for a
-- single-row update of a shot (medians of 6 rounds of 300 alternated on one connection): at load
-- ~4, 0.30 ms without the trigger, 0.43 with 0017's, 0.30 with static statements; a second run at
-- load ~6.5, 0.50 without, 0.60 with these. Static statements keep their plans per table.

-- Adds the writing transaction's row for each team (about one in 64 folds the team's rows).
CREATE OR REPLACE FUNCTION answer_changed_in(teams text[]) RETURNS void LANGUAGE plpgsql AS $$
DECLARE
  t text;
  x bigint := pg_current_xact_id()::text::bigint;
BEGIN
  FOREACH t IN ARRAY teams LOOP
    INSERT INTO answer_change (team_id, xid) VALUES (t, x) ON CONFLICT DO NOTHING;
    IF FOUND AND random() < 1.0 / 64 THEN
      PERFORM answer_stamp_fold(t);
    END IF;
  END LOOP;
END $$;--> statement-breakpoint

-- TG_ARGV[0] names the table's team column: organization_id (member) or team_id (the others).
-- Each branch is planned only where it runs, so a table without the other column is fine.
CREATE OR REPLACE FUNCTION answer_changed() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  teams text[];
BEGIN
  IF TG_ARGV[0] = 'organization_id' THEN
    IF TG_OP = 'INSERT' THEN
      teams := ARRAY(SELECT DISTINCT organization_id FROM new_rows);
    ELSIF TG_OP = 'DELETE' THEN
      teams := ARRAY(SELECT DISTINCT organization_id FROM old_rows);
    ELSE
      teams := ARRAY(SELECT organization_id FROM new_rows UNION SELECT organization_id FROM old_rows);
    END IF;
  ELSIF TG_OP = 'INSERT' THEN
    teams := ARRAY(SELECT DISTINCT team_id FROM new_rows);
  ELSIF TG_OP = 'DELETE' THEN
    teams := ARRAY(SELECT DISTINCT team_id FROM old_rows);
  ELSE
    teams := ARRAY(SELECT team_id FROM new_rows UNION SELECT team_id FROM old_rows);
  END IF;
  PERFORM answer_changed_in(teams);
  RETURN NULL;
END $$;--> statement-breakpoint

CREATE OR REPLACE FUNCTION answer_changed_name() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF EXISTS (SELECT 1 FROM new_rows n JOIN old_rows o ON o.id = n.id WHERE n.name IS DISTINCT FROM o.name) THEN
    PERFORM answer_changed_in(ARRAY['*']);
  END IF;
  RETURN NULL;
END $$;
