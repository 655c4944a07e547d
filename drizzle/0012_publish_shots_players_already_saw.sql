-- Shots became visible to players only once published (0011). Before that, a player saw every shot
-- of theirs and every shot shared with them: those with results or shares stay visible (published
-- now, by nobody); shots still without results wait for a coach's review like new ones.
-- A data change, which drizzle-kit cannot generate.
UPDATE shot SET published_at = now()
  WHERE published_at IS NULL
    AND (EXISTS (SELECT 1 FROM shot_result r WHERE r.shot_id = shot.id AND r.results IS NOT NULL)
      OR EXISTS (SELECT 1 FROM shot_share s WHERE s.shot_id = shot.id));
