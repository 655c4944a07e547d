-- Clips stored before uploads dropped place tags (server/media/probe.ts, withoutPlaceTags) lose them
-- here: the same tag names, in the format's tags and in each stream's tags. \m \M are PostgreSQL's
-- word boundaries (PostgreSQL manual §9.7.3.3).
CREATE FUNCTION pg_temp.lf_without_place(tags jsonb) RETURNS jsonb LANGUAGE sql IMMUTABLE AS $$
  SELECT coalesce(jsonb_object_agg(k, v), '{}'::jsonb) FROM jsonb_each(tags) AS t(k, v)
  WHERE k !~* '(location|gps|\mxyz\M|geo|latitude|longitude|coordinates)'
$$;--> statement-breakpoint
UPDATE clip SET probe = jsonb_set(probe, '{raw,format,tags}', pg_temp.lf_without_place(probe #> '{raw,format,tags}'))
  WHERE jsonb_typeof(probe #> '{raw,format,tags}') = 'object';--> statement-breakpoint
UPDATE clip SET probe = jsonb_set(probe, '{raw,streams}', (
    SELECT jsonb_agg(CASE WHEN jsonb_typeof(s -> 'tags') = 'object' THEN jsonb_set(s, '{tags}', pg_temp.lf_without_place(s -> 'tags')) ELSE s END ORDER BY i)
    FROM jsonb_array_elements(probe #> '{raw,streams}') WITH ORDINALITY AS e(s, i)))
  WHERE jsonb_typeof(probe #> '{raw,streams}') = 'array' AND jsonb_array_length(probe #> '{raw,streams}') > 0;
