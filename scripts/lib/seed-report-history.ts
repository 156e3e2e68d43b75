// A year of invented shop history for `npm run bench:reports`, written in bulk by PostgreSQL itself
// (INSERT … SELECT over generate_series, a handful of statements in all, no row-by-row round trips).
// Runs after seedDemo(), whose users, kits, revisions, cut parts and shop settings it builds on.
// Proportions (invented, roughly a small kit shop's): 70 % twelve-site kits, 20 % six-site kits,
// 10 % spare packs; 1–3 units per order; ~93 % of orders older than three weeks shipped, ~3 %
// cancelled, the rest late; first leak tests pass 88 % on revision A and 95 % on later ones; 1 % of
// sticks miscut. The random numbers are seeded, so every run seeds the same history.
import type pg from 'pg'

const STATEMENTS: string[] = [
  `select setseed(0.4242)`,

  // Orders: placed over the last 365 days; the state follows the age.
  `create temp table bench_orders as
   select g, placed, r1, r2, r3, r4,
     case
       when age < 1 then 'open'
       when age < 20 then case when r1 < 0.04 then 'cancelled' when age > 6 and r1 < 0.55 then 'shipped' else 'released' end
       else case when r1 < 0.03 then 'cancelled' when r1 < 0.045 then 'partially_shipped' when r1 < 0.06 then 'released' else 'shipped' end
     end::order_status as status,
     least(placed + (2 + r2 * 10) * interval '1 day', now() - interval '1 hour') as shipped_at,
     case when r4 < 0.7 then 'MW-TOTE-12' when r4 < 0.9 then 'MW-TOTE-6C' when r4 < 0.95 then 'MW-SPARE-SPR6' else 'MW-SPARE-CUP12' end as kit_sku,
     case when r3 < 0.8 then 1 when r3 < 0.95 then 2 else 3 end as quantity
   from (
     select g, now() - random() * interval '365 days' as placed, random() as r1, random() as r2, random() as r3, random() as r4
     from generate_series(1, 20000) g
   ) x, lateral (select extract(epoch from now() - x.placed) / 86400.0 as age) a`,

  `insert into orders (number, source, status, payment_status, customer_name, customer_email, ship_name, ship_line1, ship_city,
     ship_postal_code, ship_country, placed_at, promised_ship_date, total_cents, released_at, shipped_at, cancelled_at, created_at, updated_at)
   select 'BN-' || lpad(g::text, 6, '0'), 'store', status, 'paid', 'Bench Grower ' || g, 'grower' || g || '@leafmail.example',
     'Bench Grower ' || g, g || ' Fernhollow Lane', 'Millbrook Falls', '97001', 'US', placed, (placed + interval '14 days')::date, 12900 * quantity,
     case when status not in ('open', 'cancelled') then placed + interval '4 hours' end,
     case when status = 'shipped' then shipped_at end,
     case when status = 'cancelled' then placed + interval '1 day' end,
     placed, placed
   from bench_orders`,

  `create temp table bench_kits as
   select k.id as kit_id, k.sku,
     (array_agg(r.id order by r.code))[1] as first_rev, (array_agg(r.id order by r.code desc))[1] as last_rev
   from kits k join kit_revisions r on r.kit_id = k.id and r.status = 'released'
   group by k.id, k.sku`,

  `insert into order_lines (order_id, line_no, kit_id, store_product_id, sku, description, quantity, unit_price_cents)
   select o.id, 1, k.kit_id, null, k.sku, k.sku, b.quantity, 12900
   from bench_orders b join orders o on o.number = 'BN-' || lpad(b.g::text, 6, '0') join bench_kits k on k.sku = b.kit_sku`,

  // One work order per unit of every order released; the 12-site kit moved to revision B half a year ago.
  `create temp table bench_units as
   select gen_random_uuid() as id, o.id as order_id, l.id as line_id, b.g, i, b.status as order_status, b.placed, b.shipped_at,
     case when k.sku = 'MW-TOTE-12' and b.placed < now() - interval '180 days' then k.first_rev else k.last_rev end as rev_id,
     random() as r, random() as r_test
   from bench_orders b
   join orders o on o.number = 'BN-' || lpad(b.g::text, 6, '0')
   join order_lines l on l.order_id = o.id
   join bench_kits k on k.kit_id = l.kit_id
   cross join lateral generate_series(1, b.quantity) i
   where b.status <> 'open'`,

  `alter table bench_units add column has_cuts boolean, add column has_test boolean, add column status work_order_status, add column released_at timestamptz`,
  `update bench_units u set
     has_cuts = exists (select 1 from cut_parts c where c.revision_id = u.rev_id),
     has_test = (select r.leak_test_min_pressure_pa is not null from kit_revisions r where r.id = u.rev_id),
     released_at = u.placed + interval '4 hours'`,
  `update bench_units set status = case
     when order_status = 'shipped' then 'shipped'
     when order_status = 'cancelled' then 'cancelled'
     when order_status = 'partially_shipped' then case when i = 1 then 'shipped' else 'built' end
     when not has_cuts then 'built'
     when placed > now() - interval '2 days' then 'waiting_cut'
     else case when r < 0.25 then 'waiting_cut' when r < 0.4 then 'cut' when r < 0.6 then 'building' when r < 0.67 then 'rework' else 'built' end
   end::work_order_status`,

  `insert into work_orders (id, serial, order_id, order_line_id, kit_revision_id, status, due_date, created_at, updated_at)
   select id, 'U-' || nextval('work_order_serial_seq'), order_id, line_id, rev_id, status, (placed + interval '14 days')::date, released_at,
     case when status = 'shipped' then coalesce(shipped_at, placed + interval '8 days') else released_at + r * (now() - released_at) end
   from bench_units`,

  // Build history of the units that went through the build bench: every step ticked for a built
  // unit, half of them for one still building; leak test attempt 1, and a passing retest after a failure.
  `alter table bench_units add column built_at timestamptz`,
  `update bench_units set built_at = released_at + 0.6 * least(coalesce(case when status = 'shipped' then coalesce(shipped_at, placed + interval '8 days') end, now()) - released_at, interval '3 days')
   where has_cuts and status in ('building', 'rework', 'built', 'packed', 'shipped')`,

  `insert into build_step_ticks (work_order_id, build_step_id, ticked_by, ticked_at)
   select u.id, s.id, (select id from users where role = 'assembler' limit 1), u.built_at - (n.steps - s.position + 1) * interval '10 minutes'
   from bench_units u
   join build_steps s on s.revision_id = u.rev_id
   join (select revision_id, count(*) as steps from build_steps group by revision_id) n on n.revision_id = u.rev_id
   where u.built_at is not null and (u.status in ('built', 'packed', 'shipped') or s.position <= n.steps / 2)`,

  `insert into leak_tests (work_order_id, attempt, start_pressure_pa, end_pressure_pa, hold_minutes, water_volume_ml, entered_unit, passed, reason, tested_by, tested_at)
   select u.id, 1, 103421, case when p.passed then 102000 else 95000 end, 10, 30000, 'psi', p.passed,
     case when p.passed then null else 'Pressure dropped more than allowed' end, (select id from users where role = 'assembler' limit 1),
     u.built_at - interval '5 minutes'
   from bench_units u
   cross join lateral (select case when u.status = 'rework' then false when u.status = 'building' then null
     else u.r_test < case when u.rev_id in (select first_rev from bench_kits where sku = 'MW-TOTE-12') then 0.88 else 0.95 end end as passed) p
   where u.built_at is not null and u.has_test and p.passed is not null`,

  `insert into leak_tests (work_order_id, attempt, start_pressure_pa, end_pressure_pa, hold_minutes, water_volume_ml, entered_unit, passed, tested_by, tested_at)
   select t.work_order_id, 2, 103421, 102000, 10, 30000, 'psi', true, t.tested_by, t.tested_at + interval '4 minutes'
   from leak_tests t join bench_units u on u.id = t.work_order_id
   where t.attempt = 1 and not t.passed and u.status in ('built', 'packed', 'shipped')`,

  // Cut runs: one a day, holding the pieces of the units released that day; pieces laid onto the
  // longest stick of their pipe in a fixed number per stick (a plain plan, not the nesting engine's).
  `create temp table bench_pieces as
   select u.id as work_order_id, c.id as cut_part_id, c.part_id, c.length, (u.released_at at time zone 'UTC')::date as day,
     (select max(x) from unnest(p.stick_lengths) x) as stick_length
   from bench_units u
   join cut_parts c on c.revision_id = u.rev_id
   join parts p on p.id = c.part_id
   cross join lateral generate_series(1, c.quantity) q
   where u.has_cuts and u.status not in ('waiting_cut', 'cancelled')`,

  `create temp table bench_runs as
   select gen_random_uuid() as id, day, row_number() over (order by day) as n,
     case when day < (now() at time zone 'UTC')::date - 2 then 'done' else 'published' end::cut_run_status as status
   from (select distinct day from bench_pieces) d`,

  `create temp table bench_placed as
   select p.*, r.id as run_id,
     (row_number() over (partition by r.id, p.part_id order by p.length desc, p.work_order_id) - 1)
       / greatest(1, ((p.stick_length - s.end_trim) / (max(p.length) over (partition by r.id, p.part_id) + s.kerf))) as stick_no,
     s.kerf, s.end_trim, s.min_offcut
   from bench_pieces p join bench_runs r on r.day = p.day cross join shop_settings s`,

  `create temp table bench_sticks as
   select gen_random_uuid() as id, run_id, part_id, stick_no, max(stick_length) as length, max(end_trim) as trim,
     max(stick_length) - max(end_trim) - sum(length + kerf) as remnant, max(min_offcut) as min_offcut,
     row_number() over (partition by run_id order by part_id, stick_no) as position,
     random() < 0.01 as damaged
   from bench_placed group by run_id, part_id, stick_no`,

  `insert into cut_runs (id, number, status, kerf, end_trim, min_offcut, plan_status, sticks_used, length_used, piece_length, kerf_loss, trim_loss,
     offcut_length, scrap_length, offcuts_made, created_at, published_at, completed_at)
   select r.id, 'CR-B' || lpad(r.n::text, 4, '0'), r.status, s.kerf, s.end_trim, s.min_offcut, 'feasible', t.sticks, t.used, t.pieces, t.kerf, t.trim,
     t.offcut, t.scrap, t.offcuts, r.day + interval '8 hours', r.day + interval '9 hours',
     case when r.status = 'done' then r.day + interval '1 day 10 hours' end
   from bench_runs r cross join shop_settings s
   join (
     select st.run_id, count(*)::int as sticks, sum(st.length) as used, sum(pl.pieces) as pieces, sum(pl.kerf) as kerf, sum(st.trim) as trim,
       sum(case when st.remnant >= st.min_offcut then st.remnant else 0 end) as offcut, sum(case when st.remnant < st.min_offcut then st.remnant else 0 end) as scrap,
       count(*) filter (where st.remnant >= st.min_offcut)::int as offcuts
     from bench_sticks st
     join (select run_id, part_id, stick_no, sum(length) as pieces, sum(kerf) as kerf from bench_placed group by 1, 2, 3) pl
       on pl.run_id = st.run_id and pl.part_id = st.part_id and pl.stick_no = st.stick_no
     group by st.run_id
   ) t on t.run_id = r.id`,

  `insert into offcuts (id, part_id, length, status, created_at)
   select st.id, st.part_id, st.remnant, 'in_stock', r.day + interval '1 day'
   from bench_sticks st join bench_runs r on r.id = st.run_id
   where r.status = 'done' and not st.damaged and st.remnant >= st.min_offcut`,

  `insert into cut_run_sticks (id, cut_run_id, part_id, stick_length, length, trim, pattern_index, position, status, remnant, remnant_is_offcut, offcut_id,
     started_at, finished_at, damaged_reason, damaged_at)
   select st.id, st.run_id, st.part_id, st.length, st.length, st.trim, st.position - 1, st.position,
     case when r.status = 'published' then 'pending' when st.damaged then 'damaged' else 'done' end::cut_stick_status,
     st.remnant, st.remnant >= st.min_offcut,
     case when r.status = 'done' and not st.damaged and st.remnant >= st.min_offcut then st.id end,
     case when r.status = 'done' then r.day + interval '1 day 8 hours' end,
     case when r.status = 'done' and not st.damaged then r.day + interval '1 day 9 hours' end,
     case when r.status = 'done' and st.damaged then 'Miscut' end,
     case when r.status = 'done' and st.damaged then r.day + interval '1 day 9 hours' end
   from bench_sticks st join bench_runs r on r.id = st.run_id`,

  `insert into cut_run_cuts (cut_run_id, stick_id, position, "offset", length, work_order_id, cut_part_id, status, cut_at)
   select c.run_id, st.id, c.pos, c.off, c.length, c.work_order_id, c.cut_part_id,
     case when r.status = 'published' then 'pending' when st.damaged and c.pos > 1 then 'replanned' else 'cut' end::cut_status,
     case when r.status = 'done' then r.day + interval '1 day 9 hours' end
   from (
     select bp.*, row_number() over w as pos, sum(bp.length + bp.kerf) over w - (bp.length + bp.kerf) + bp.end_trim as off
     from bench_placed bp window w as (partition by bp.run_id, bp.part_id, bp.stick_no order by bp.length desc, bp.work_order_id, bp.cut_part_id rows unbounded preceding)
   ) c
   join bench_sticks st on st.run_id = c.run_id and st.part_id = c.part_id and st.stick_no = c.stick_no
   join bench_runs r on r.id = c.run_id`,

  // Shipments: one per order shipped or partly shipped, one parcel with the units that left.
  `create temp table bench_shipments as
   select gen_random_uuid() as id, b.g, o.id as order_id, coalesce(o.shipped_at, b.placed + interval '8 days') as shipped_at,
     array_agg(u.id order by u.i) as units
   from bench_orders b join orders o on o.number = 'BN-' || lpad(b.g::text, 6, '0') join bench_units u on u.order_id = o.id and u.status = 'shipped'
   where b.status in ('shipped', 'partially_shipped')
   group by b.g, o.id, o.shipped_at, b.placed`,

  `insert into shipments (id, order_id, status, carrier, service, tracking_number, charge_cents, labelled_at, shipped_at, shipped_by, created_by, created_at)
   select s.id, s.order_id, 'shipped', 'Bench carrier', 'Ground', 'BT' || lpad(s.g::text, 10, '0'), 1495, s.shipped_at - interval '2 hours', s.shipped_at,
     (select id from users where role = 'packer' limit 1), (select id from users where role = 'packer' limit 1), s.shipped_at - interval '3 hours'
   from bench_shipments s`,

  `insert into parcels (shipment_id, position, box_name, length, width, height, work_order_ids, estimated_grams, actual_grams, dimensional_grams, billable_grams, sscc)
   select s.id, 1, 'Tote carton', 1000000, 600000, 500000, s.units, 6500 * cardinality(s.units), 6500 * cardinality(s.units), 4000, 6500 * cardinality(s.units),
     '9' || lpad(s.g::text, 17, '0')
   from bench_shipments s`,

  // The timeline: every order received; one in ten came in unpaid and was paid up to two days later.
  `insert into order_events (order_id, kind, message, created_at)
   select o.id, 'received', 'Order received from the web store.', o.placed_at from orders o where o.number like 'BN-%'`,
  `insert into order_events (order_id, kind, message, created_at)
   select o.id, 'payment', 'The web store reports this order paid.', o.placed_at + b.r2 * interval '2 days'
   from bench_orders b join orders o on o.number = 'BN-' || lpad(b.g::text, 6, '0') where b.r3 < 0.1 and b.status <> 'open'`,

  `analyze`,
]

/** Seeds the history; returns how many rows each table holds afterwards. */
export async function seedReportHistory(pool: pg.Pool, log: (line: string) => void): Promise<Record<string, number>> {
  const client = await pool.connect()
  try {
    await client.query('begin')
    for (const statement of STATEMENTS) {
      const t0 = performance.now()
      const result = await client.query(statement)
      const first = statement.trim().split('\n')[0]!.slice(0, 70)
      log(`  ${first.padEnd(72)} ${String(result.rowCount ?? '').padStart(7)} rows ${((performance.now() - t0) / 1000).toFixed(1).padStart(5)} s`)
    }
    await client.query('commit')
  } catch (err) {
    await client.query('rollback')
    throw err
  } finally {
    client.release()
  }
  const tables = ['orders', 'order_lines', 'order_events', 'work_orders', 'build_step_ticks', 'leak_tests', 'cut_runs', 'cut_run_sticks', 'cut_run_cuts', 'shipments', 'parcels']
  const counts = await pool.query<Record<string, string>>(`select ${tables.map((t) => `(select count(*) from ${t}) as ${t}`).join(', ')}`)
  return Object.fromEntries(tables.map((t) => [t, Number(counts.rows[0]![t])]))
}
