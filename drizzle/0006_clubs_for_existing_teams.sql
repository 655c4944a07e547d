-- Teams that existed before plans came keep everything they had: each becomes a club of its own on
-- the largest plan, granted (no subscription, so no webhook ever changes it). Data only, which
-- drizzle-kit cannot express; a fresh database has no teams yet and this inserts nothing.
WITH t AS (
  SELECT o.id AS team_id, o.name, gen_random_uuid() AS club_id
  FROM "organization" o
  WHERE NOT EXISTS (SELECT 1 FROM "club_team" ct WHERE ct.team_id = o.id)
), c AS (
  INSERT INTO "club" ("id", "name", "plan") SELECT club_id, name, 'arena' FROM t RETURNING "id"
)
INSERT INTO "club_team" ("team_id", "club_id") SELECT team_id, club_id FROM t;
