/**
 * Business-case benchmark (issue 8): a site with 10,000 motors in a throwaway PostgreSQL cluster;
 * generating its business case (load the register, assess every motor, aggregate, sensitivity,
 * store the snapshot) should take under 2 s and its PDF under 5 s. Prints wall-clock and CPU time,
 * best and median of the runs, the load average, and whether each goal is met. No assertions.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { createCase } from '../../server/cases/service.js';
import { casePdf, PDF_MAX_ITEMS } from '../../server/cases/pdf.js';
import { computeCase } from '../../server/cases/snapshot.js';
import { caseWorkbook } from '../../server/cases/xlsx.js';
import { connectDatabase } from '../../server/lib/database.js';
import { setLogLevel } from '../../server/lib/logger.js';
import { migrator } from '../../server/lib/migrator.js';
import { startCluster } from '../../server/lib/postgres-cluster.js';
import { Tenant } from '../../server/lib/tenant.js';
import { BusinessCase, Motor, Organization, User } from '../../server/models/index.js';
import { createSite } from '../support/api.js';

const MOTORS = 10_000;
const RUNS = 3;
const APPLICATIONS = ['fan', 'pump', 'compressor', 'conveyor', 'mixer', 'other'] as const;
const CONTROLS = ['direct-on-line', 'throttle-valve', 'outlet-damper', 'inlet-vanes', 'variable-speed-drive'] as const;
const CLASSES = ['IE1', 'IE2', 'IE3', 'unknown'] as const;
const RATINGS = [0.75, 1.5, 2.2, 4, 5.5, 7.5, 11, 15, 18.5, 22, 30, 37, 45, 55, 75, 90, 110, 132, 160];

const cpuMs = () => {
  const usage = process.cpuUsage();
  return (usage.user + usage.system) / 1000;
};

async function measure<T>(work: () => Promise<T> | T): Promise<{ wall: number; cpu: number; value: T }> {
  const wall0 = performance.now();
  const cpu0 = cpuMs();
  const value = await work();
  return { wall: performance.now() - wall0, cpu: cpuMs() - cpu0, value };
}

function stats(samples: Array<{ wall: number; cpu: number }>) {
  const sorted = (values: number[]) => [...values].sort((a, b) => a - b);
  const walls = sorted(samples.map((s) => s.wall));
  const cpus = sorted(samples.map((s) => s.cpu));
  const median = (values: number[]) => values[Math.floor(values.length / 2)]!;
  return { bestWall: walls[0]!, medianWall: median(walls), bestCpu: cpus[0]!, medianCpu: median(cpus) };
}

const ms = (value: number) => `${(value / 1000).toFixed(2)} s`;

async function main() {
  setLogLevel('silent');
  const dataDir = mkdtempSync(join(tmpdir(), 'statorline-bench-'));
  const cluster = await startCluster({ dataDir, port: 56000 + Math.floor(Math.random() * 3000), throwaway: true });
  try {
    await cluster.ensureDatabase('statorline_bench');
    const sequelize = connectDatabase(cluster.url('statorline_bench'), { poolMax: 4 });
    await migrator(sequelize).up();
    const organization = await Organization.create({ name: 'Bench Works', slug: 'bench-works' });
    const site = await createSite(organization, { name: 'Large plant' });
    const user = await User.create({ organizationId: organization.id, email: 'bench@bench.example', name: 'Bench engineer', role: 'engineer', status: 'active', passwordHash: null });
    const rows = Array.from({ length: MOTORS }, (_, index) => {
      const application = APPLICATIONS[index % APPLICATIONS.length]!;
      return {
        organizationId: organization.id,
        siteId: site.id,
        tag: `M-${String(index).padStart(5, '0')}`,
        description: null,
        area: `Feeder ${index % 24}`,
        application,
        ratedPowerKw: RATINGS[index % RATINGS.length]!,
        poles: [2, 4, 6][index % 3]!,
        voltageV: 400,
        frequencyHz: 50,
        speedRpm: null,
        ratedCurrentA: null,
        nameplateEfficiencyPct: null,
        powerFactor: null,
        frame: null,
        enclosure: null,
        manufacturer: null,
        yearInstalled: null,
        efficiencyClass: CLASSES[index % CLASSES.length]!,
        controlMethod: application === 'fan' || application === 'pump' ? CONTROLS[index % CONTROLS.length]! : 'direct-on-line',
        hoursPerYear: 2000 + (index % 7) * 900,
        loadFactor: 0.5 + (index % 5) * 0.1,
        dutyProfile: index % 10 === 0 ? [{ fraction: 0.5, hours: 3000 }, { fraction: 0.8, hours: 3000 }] : null,
      };
    });
    const insert = await measure(async () => {
      for (let start = 0; start < rows.length; start += 2000) await Motor.bulkCreate(rows.slice(start, start + 2000) as never[]);
    });
    console.log(`inserted ${MOTORS} motors in ${ms(insert.wall)}; load average at start ${loadavg().map((v) => v.toFixed(1)).join(' ')}`);

    const tenant = new Tenant({ id: user.id, email: user.email, name: user.name, role: 'engineer', organization: { id: organization.id, name: organization.name } });
    await createCase(tenant, { siteId: site.id }); // warm-up (JIT, memoised class values)
    const generations = [];
    for (let run = 0; run < RUNS; run += 1) generations.push(await measure(() => createCase(tenant, { siteId: site.id })));
    const last = generations[generations.length - 1]!.value;
    const row = (await BusinessCase.findByPk(last.id))!;
    const computes = [];
    for (let run = 0; run < RUNS; run += 1) computes.push(await measure(() => computeCase(row.inputs)));
    await casePdf(row); // warm-up (fonts)
    const pdfs = [];
    for (let run = 0; run < RUNS; run += 1) pdfs.push(await measure(() => casePdf(row)));
    const workbooks = [];
    for (let run = 0; run < RUNS; run += 1) workbooks.push(await measure(() => caseWorkbook(row)));

    const generation = stats(generations);
    const compute = stats(computes);
    const pdf = stats(pdfs);
    const xlsx = stats(workbooks);
    const totals = last.results.totals;
    console.log(`case: ${totals.motors} motors, ${totals.recommendedMotors} retrofits, savings ${Math.round(totals.savingsKwh)} kWh/yr, ${totals.savingsCost} EUR/yr, NPV ${totals.npv} EUR, payback ${totals.simplePaybackYears} yr; results ${(JSON.stringify(last.results).length / 1e6).toFixed(1)} MB JSON`);
    console.log(`generate (POST /api/cases work: load, assess, aggregate, store; ${RUNS} runs): wall best ${ms(generation.bestWall)} median ${ms(generation.medianWall)}; CPU best ${ms(generation.bestCpu)} median ${ms(generation.medianCpu)}; goal < 2 s: ${generation.medianWall < 2000 ? 'met' : generation.bestCpu < 2000 ? 'met in CPU time, not in wall time on this machine' : 'not met'}`);
    console.log(`  of which computeCase alone: wall best ${ms(compute.bestWall)} median ${ms(compute.medianWall)}; CPU best ${ms(compute.bestCpu)}`);
    console.log(`PDF (${Math.min(PDF_MAX_ITEMS, totals.recommendedMotors)} of ${totals.recommendedMotors} retrofits listed, ${(pdfs[0]!.value.length / 1e6).toFixed(2)} MB): wall best ${ms(pdf.bestWall)} median ${ms(pdf.medianWall)}; CPU best ${ms(pdf.bestCpu)} median ${ms(pdf.medianCpu)}; goal < 5 s: ${pdf.medianWall < 5000 ? 'met' : pdf.bestCpu < 5000 ? 'met in CPU time, not in wall time on this machine' : 'not met'}`);
    console.log(`.xlsx (${totals.motors} rows): wall best ${ms(xlsx.bestWall)} median ${ms(xlsx.medianWall)}; CPU best ${ms(xlsx.bestCpu)}`);
    console.log(`load average at end ${loadavg().map((v) => v.toFixed(1)).join(' ')}; peak RSS ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MiB`);
    await sequelize.close();
  } finally {
    await cluster.stop();
    rmSync(dataDir, { recursive: true, force: true });
  }
}

await main();
