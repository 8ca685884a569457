/**
 * `npm run bench -- register`: the motor register's first page with 100,000 motors in one
 * organisation (three sites), on a throwaway PostgreSQL cluster. Goal (issue 6): p95 under 50 ms with
 * a filter. Measures the service call (two queries: the page and the count, plus site names) for
 * several filters, 200 runs each after a warm-up, and prints p50/p95/max.
 * `BENCH_MOTORS=n` changes the count.
 */
import { cpus, loadavg } from 'node:os';
import { listMotors } from '../../server/motors/service.js';
import { Site } from '../../server/models/index.js';
import { motorListQuery } from '../../server/shared/motor.js';
import { benchDatabase, percentile } from './bench-database.js';

const MOTORS = Number(process.env.BENCH_MOTORS ?? 100_000);
const RUNS = 200;
const GOAL_MS = 50;

async function main() {
  const db = await benchDatabase();
  try {
    const sites = [db.site];
    for (const name of ['Cold store', 'Wastewater works']) {
      sites.push(await Site.create({ ...db.site.get({ plain: true }), id: undefined as unknown as number, name }));
    }
    let start = process.hrtime.bigint();
    // One bulk INSERT … SELECT from generate_series: 100,000 rows in a second or two.
    await db.sequelize.query(
      `INSERT INTO motors (organization_id, site_id, tag, description, area, application, rated_power_kw, speed_rpm, poles, voltage_v,
         frequency_hz, efficiency_class, control_method, hours_per_year, status, manufacturer, version, created_at, updated_at)
       SELECT $1, ($2::int[])[1 + i % 3], 'M-' || lpad(i::text, 6, '0'), 'Motor ' || i || ' of line ' || (i % 40), 'Area ' || (i % 25),
         (ARRAY['fan','pump','compressor','conveyor','mixer','other'])[1 + i % 6]::"enum_motors_application",
         (ARRAY[0.37,0.75,1.5,3,5.5,7.5,11,15,22,37,55,75,110,160])[1 + i % 14], 1460, 4, 400, 50,
         (ARRAY['IE1','IE2','IE3','IE4','unknown'])[1 + i % 5]::"enum_motors_efficiency_class",
         (ARRAY['direct-on-line','throttle-valve','outlet-damper','inlet-vanes','variable-speed-drive'])[1 + i % 5]::"enum_motors_control_method",
         6000, CASE WHEN i % 50 = 0 THEN 'retired' ELSE 'in-service' END::"enum_motors_status",
         (ARRAY['Example Motorworks','Sample Electric','Demo Drives'])[1 + i % 3], 0, now(), now()
       FROM generate_series(1, $3) AS i`,
      { bind: [db.organization.id, sites.map((site) => site.id), MOTORS] },
    );
    await db.sequelize.query('ANALYZE motors');
    process.stdout.write(`seeded ${MOTORS} motors in ${(Number(process.hrtime.bigint() - start) / 1e6).toFixed(0)} ms; load average ${loadavg()[0]?.toFixed(1)} on ${cpus().length} cores\n`);

    const cases: Array<[string, Record<string, unknown>]> = [
      ['no filter (all but retired), sort tag', {}],
      ['application=fan', { application: 'fan' }],
      ['siteId + application=pump,fan + minKw=5', { siteId: String(sites[1]!.id), application: 'pump,fan', minKw: '5' }],
      ['efficiencyClass=IE1, sort -ratedPowerKw', { efficiencyClass: 'IE1', sort: '-ratedPowerKw' }],
      ['q=line 17 (free text, trigram index)', { q: 'line 17' }],
      ['q=M-0999 (free text, tag)', { q: 'M-0999' }],
    ];
    let worst = 0;
    for (const [label, raw] of cases) {
      const query = motorListQuery.parse(raw);
      for (let warm = 0; warm < 10; warm += 1) await listMotors(db.tenant, query);
      const times: number[] = [];
      let total = 0;
      for (let run = 0; run < RUNS; run += 1) {
        start = process.hrtime.bigint();
        const page = await listMotors(db.tenant, query);
        times.push(Number(process.hrtime.bigint() - start) / 1e6);
        total = page.total;
      }
      times.sort((a, b) => a - b);
      const p95 = percentile(times, 95);
      if (label !== cases[0]![0]) worst = Math.max(worst, p95);
      process.stdout.write(
        `${label.padEnd(44)} total ${String(total).padStart(6)}  p50 ${percentile(times, 50).toFixed(1)} ms  p95 ${p95.toFixed(1)} ms  max ${times[times.length - 1]!.toFixed(1)} ms\n`,
      );
    }
    process.stdout.write(`worst p95 with a filter: ${worst.toFixed(1)} ms — goal < ${GOAL_MS} ms: ${worst < GOAL_MS ? 'met' : 'NOT met'}\n`);
  } finally {
    await db.close();
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exit(1);
});
