-- Stored results' chart series become columns (decision 202): each series' points, objects of
-- frame, tMs, tFromStrikeMs, value and segment, become arrays of frame, tFromStrikeMs and value
-- with runs of segments; values to 6 significant digits and times to the ns, as the engine now
-- writes them. tMs is dropped (frame and the clip's frame clock give it). Rows without points
-- (no results, an error, or already columns) are left as they are.
CREATE FUNCTION pg_temp.lf_significant(v numeric) RETURNS numeric LANGUAGE sql IMMUTABLE AS $$
  SELECT CASE WHEN v = 0 THEN 0 ELSE trim_scale(round(v, 5 - floor(log(abs(v)))::int)) END
$$;--> statement-breakpoint
CREATE FUNCTION pg_temp.lf_columns(s jsonb) RETURNS jsonb LANGUAGE sql IMMUTABLE AS $$
  SELECT jsonb_build_object(
    'unit', s -> 'unit',
    'frame', coalesce(jsonb_agg(p -> 'frame' ORDER BY i), '[]'),
    'tFromStrikeMs', coalesce(jsonb_agg(to_jsonb(trim_scale(round((p ->> 'tFromStrikeMs')::numeric, 6))) ORDER BY i), '[]'),
    'value', coalesce(jsonb_agg(to_jsonb(pg_temp.lf_significant((p ->> 'value')::numeric)) ORDER BY i), '[]'),
    'segments', coalesce((
      SELECT jsonb_agg(jsonb_build_array(seg, n) ORDER BY first) FROM (
        SELECT seg, min(i) AS first, count(*) AS n FROM (
          SELECT q ->> 'segment' AS seg, j AS i, j - row_number() OVER (PARTITION BY q ->> 'segment' ORDER BY j) AS run
          FROM jsonb_array_elements(s -> 'points') WITH ORDINALITY AS f(q, j)) samples
        GROUP BY seg, run) runs), '[]'))
  FROM jsonb_array_elements(s -> 'points') WITH ORDINALITY AS e(p, i)
$$;--> statement-breakpoint
CREATE FUNCTION pg_temp.lf_results_columns(r jsonb) RETURNS jsonb LANGUAGE sql IMMUTABLE AS $$
  SELECT r || jsonb_build_object('series', (r -> 'series') || coalesce(jsonb_object_agg(k, pg_temp.lf_columns(v)), '{}'))
  FROM jsonb_each(r -> 'series') AS e(k, v) WHERE jsonb_typeof(v -> 'points') = 'array'
$$;--> statement-breakpoint
UPDATE shot_result SET results = pg_temp.lf_results_columns(results::jsonb)::json
  WHERE json_typeof(results -> 'series') = 'object' AND json_typeof(results -> 'series' -> 'puckSpeed' -> 'points') = 'array';
