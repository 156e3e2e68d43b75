import type pg from 'pg'

/**
 * Counts committed row changes in every table of the app's schema, per table, with a trigger on each:
 * a change that rolls back takes its count with it. Reading the counts is one small query, so a
 * test can check "this rejected request changed no row" around every single request.
 */
export async function installRowChangeCounter(pool: pg.Pool) {
  await pool.query(`
    create schema if not exists probe;
    create table if not exists probe.row_changes (tbl text primary key, n bigint not null);
    create or replace function probe.count_row_change() returns trigger language plpgsql as $$
    begin
      insert into probe.row_changes values (tg_table_name, 1)
        on conflict (tbl) do update set n = probe.row_changes.n + 1;
      return null;
    end $$;
  `)
  const { rows } = await pool.query<{ name: string }>("select quote_ident(tablename) as name from pg_tables where schemaname = 'public'")
  for (const { name } of rows) {
    await pool.query(`create or replace trigger probe_row_change after insert or update or delete on public.${name} for each row execute function probe.count_row_change()`)
  }
  return {
    tables: rows.length,
    /** Committed row changes so far, per table. */
    async read(): Promise<Map<string, number>> {
      const res = await pool.query<{ tbl: string; n: string }>('select tbl, n from probe.row_changes')
      return new Map(res.rows.map((r) => [r.tbl, Number(r.n)]))
    },
  }
}

/** The tables whose count differs between two readings. */
export function changedTables(before: Map<string, number>, after: Map<string, number>): string[] {
  return [...after].filter(([tbl, n]) => (before.get(tbl) ?? 0) !== n).map(([tbl]) => tbl)
}
