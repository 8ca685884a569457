// A site screening as a background job: start it, poll its progress, read its ranked result, and
// turn chosen rows into retrofit proposals. The job id lives in the URL, so a reload picks it up.
import { computed, onBeforeUnmount, ref, shallowRef } from 'vue';
import type { JobOutput, ScreeningResult, ScreeningRow } from 'shared/screening';
import { sumMoney } from 'calc/economics/money';
import { screeningApi, type ProposalsCreated, type ScreeningStartInput } from 'src/api/screening';

export const POLL_MS = 800;

export interface SelectionTotals {
  motors: number;
  annualKwhSaved: number;
  costSaved: number;
  co2SavedKg: number;
  kvaFreed: number;
  capex: number;
  npv: number;
}

/** Totals of some rows; money added in decimal.js and rounded once (calc's sumMoney), as the server does. */
export function totalsOf(rows: readonly ScreeningRow[]): SelectionTotals {
  const sum = (pick: (row: ScreeningRow) => number) => rows.reduce((total, row) => total + pick(row), 0);
  return {
    motors: rows.length,
    annualKwhSaved: Math.round(sum((row) => row.annualKwhSaved) * 10) / 10,
    costSaved: sumMoney(rows.map((row) => row.costSaved)),
    co2SavedKg: Math.round(sum((row) => row.co2SavedKg) * 10) / 10,
    kvaFreed: Math.round(sum((row) => row.kvaFreed) * 1000) / 1000,
    capex: sumMoney(rows.map((row) => row.capex)),
    npv: sumMoney(rows.map((row) => row.npv)),
  };
}

export function useScreening() {
  const jobId = ref<number | null>(null);
  const job = shallowRef<JobOutput | null>(null);
  const starting = ref(false);
  const pollError = ref<string | null>(null);
  const proposing = ref(false);
  let timer: ReturnType<typeof setTimeout> | null = null;
  let stopped = false;

  const running = computed(() => job.value?.status === 'queued' || job.value?.status === 'running');
  const result = computed<ScreeningResult | null>(() => (job.value?.status === 'done' ? (job.value.result as ScreeningResult) : null));

  function stopPolling(): void {
    if (timer !== null) clearTimeout(timer);
    timer = null;
  }

  async function poll(): Promise<void> {
    stopPolling();
    const id = jobId.value;
    if (id === null || stopped) return;
    try {
      const answer = await screeningApi.job(id);
      if (jobId.value !== id) return;
      job.value = answer;
      pollError.value = null;
      if (answer.status === 'queued' || answer.status === 'running') timer = setTimeout(() => void poll(), POLL_MS);
    } catch (error) {
      if (jobId.value !== id) return;
      pollError.value = error instanceof Error ? error.message : String(error);
      // A passing network hiccup should not end the watch; a missing job (404) does.
      if (!(error instanceof Error && 'status' in error && (error as { status: number }).status === 404)) timer = setTimeout(() => void poll(), POLL_MS * 3);
    }
  }

  /** Follow an existing job (from the URL). */
  function follow(id: number): Promise<void> {
    if (jobId.value === id && job.value) return Promise.resolve();
    jobId.value = id;
    job.value = null;
    return poll();
  }

  async function start(siteId: number, body: ScreeningStartInput): Promise<number> {
    starting.value = true;
    try {
      const { jobId: id } = await screeningApi.start(siteId, body);
      jobId.value = id;
      job.value = null;
      await poll();
      return id;
    } finally {
      starting.value = false;
    }
  }

  async function cancel(): Promise<void> {
    if (jobId.value === null) return;
    job.value = await screeningApi.cancel(jobId.value);
  }

  async function propose(motorIds: number[]): Promise<ProposalsCreated> {
    if (jobId.value === null) throw new Error('No screening to propose from.');
    proposing.value = true;
    try {
      return await screeningApi.propose(jobId.value, motorIds);
    } finally {
      proposing.value = false;
    }
  }

  function reset(): void {
    stopPolling();
    jobId.value = null;
    job.value = null;
    pollError.value = null;
  }

  onBeforeUnmount(() => {
    stopped = true;
    stopPolling();
  });

  return { jobId, job, running, result, starting, pollError, proposing, follow, start, cancel, propose, reset };
}
