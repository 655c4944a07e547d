// Seeds a team of benchmark size in SQL: 40 more players, 100 sessions, 5,000 clips and 50,000
// shots with stored results, each copied from the demo club's real shots (seeded through the
// clip pipeline and the mechanics engine), so rows have the sizes real ones have. Column lists
// come from the catalogue, so the copy follows schema changes by itself.
import pg from "pg";

export const BENCH_SIZE = { players: 40, sessions: 100, clips: 5000, shotsPerClip: 10 } as const;

async function columns(c: pg.Client, table: string): Promise<string[]> {
  const r = await c.query<{ column_name: string }>(
    `select column_name from information_schema.columns where table_schema = 'public' and table_name = $1 and is_generated = 'NEVER' order by ordinal_position`,
    [table],
  );
  return r.rows.map((x) => x.column_name);
}

/** "insert into t (cols) select <override or alias.col> …" over every column of the table. */
async function copySql(c: pg.Client, table: string, alias: string, overrides: Record<string, string>, from: string) {
  const cols = await columns(c, table);
  const exprs = cols.map((k) => overrides[k] ?? `${alias}.${k}`);
  return `insert into "${table}" (${cols.map((k) => `"${k}"`).join(", ")}) select ${exprs.join(", ")} ${from}`;
}

export async function seedBenchTeam(url: string, teamId: string): Promise<{ shots: number; clips: number; players: string[] }> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    await c.query("begin");
    await c.query(
      `insert into "user" (id, name, email, email_verified, created_at, updated_at)
       select 'bench-player-' || g, 'Bench Player ' || g, 'bench-player-' || g || '@ravens.example', true, now(), now() from generate_series(1, $1::int) g`,
      [BENCH_SIZE.players],
    );
    await c.query(
      `insert into member (id, organization_id, user_id, role, created_at)
       select 'bench-member-' || g, $1, 'bench-player-' || g, 'player', now() from generate_series(1, $2::int) g`,
      [teamId, BENCH_SIZE.players],
    );
    const players = (await c.query<{ user_id: string }>(`select user_id from member where organization_id = $1 and role = 'player' order by user_id`, [teamId])).rows.map((r) => r.user_id);
    await c.query(
      `create temp table bench_sessions on commit drop as
       with s as (insert into training_session (team_id, date, venue, drill)
                  select $1, date '2024-09-01' + g, 'Bench rink ' || (g % 3 + 1), 'Point shots' from generate_series(1, $2::int) g returning id)
       select id, row_number() over () - 1 as i from s`,
      [teamId, BENCH_SIZE.sessions],
    );
    const tpl = await c.query<{ id: string; clip_id: string }>(`select s.id, s.clip_id from shot s join shot_result r on r.shot_id = s.id where s.team_id = $1 and r.results is not null order by s.id`, [teamId]);
    if (!tpl.rows.length) throw new Error("the demo seed left no shot with results to copy");
    await c.query(`create temp table bench_tpl on commit drop as select id, clip_id, row_number() over (order by id) - 1 as i from shot where id = any($1::uuid[])`, [tpl.rows.map((r) => r.id)]);
    await c.query(`create temp table bench_players on commit drop as select p, ordinality - 1 as i from unnest($1::text[]) with ordinality p`, [players]);
    const n = tpl.rows.length;
    await c.query(
      `create temp table bench_clips on commit drop as
       select gen_random_uuid() as id, g, (select id from bench_tpl where i = g % ${n}) as tpl_shot, (select clip_id from bench_tpl where i = g % ${n}) as tpl_clip,
              (select p from bench_players where i = g % ${players.length}) as player, (select id from bench_sessions where i = g % ${BENCH_SIZE.sessions}) as session
       from generate_series(1, ${BENCH_SIZE.clips}) g`,
    );
    await c.query(
      await copySql(c, "clip", "t", {
        id: "n.id", sha256: "null", title: "'Bench clip ' || n.g", player_id: "n.player", session_id: "n.session", original_name: "'bench-' || n.g || '.mp4'",
        created_at: "now() - n.g * interval '1 minute'", updated_at: "now() - n.g * interval '1 minute'",
      }, "from bench_clips n join clip t on t.id = n.tpl_clip"),
    );
    await c.query(
      `create temp table bench_shots on commit drop as
       select gen_random_uuid() as id, n.id as clip_id, n.tpl_shot, n.player, n.g, k from bench_clips n, generate_series(1, ${BENCH_SIZE.shotsPerClip}) k`,
    );
    await c.query(
      await copySql(c, "shot", "t", {
        id: "b.id", clip_id: "b.clip_id", player_id: "b.player", label: "'Shot ' || b.k",
        created_at: "now() - b.g * interval '1 minute' + b.k * interval '1 second'", updated_at: "now() - b.g * interval '1 minute' + b.k * interval '1 second'",
      }, "from bench_shots b join shot t on t.id = b.tpl_shot"),
    );
    await c.query(await copySql(c, "shot_result", "r", { shot_id: "b.id" }, "from bench_shots b join shot_result r on r.shot_id = b.tpl_shot"));
    await c.query("commit");
    await c.query("analyze");
    const shots = Number((await c.query(`select count(*) from shot where team_id = $1`, [teamId])).rows[0].count);
    const clips = Number((await c.query(`select count(*) from clip where team_id = $1`, [teamId])).rows[0].count);
    return { shots, clips, players };
  } catch (err) {
    await c.query("rollback").catch(() => {});
    throw err;
  } finally {
    await c.end();
  }
}
