// One business case: load the snapshot, e-mail it, record a decision, generate its next version.
// Who may do what is decided here once, from the session's role (the server checks it again).
import { computed, ref, shallowRef, type Ref } from 'vue';
import type { CaseDecisionInput, CaseOutput, CaseSend, CaseSummary } from 'shared/case';
import { EDITORS, type Role } from 'shared/roles';
import { ApiError } from 'src/api/client';
import { casesApi, type CaseExportFormat } from 'src/api/cases';
import { useSessionStore } from 'stores/session-store';

/** Roles that may record a decision on a case (DESIGN.md: approvers approve or reject). */
export const CASE_DECIDERS: readonly Role[] = ['approver'];
/** Roles that may generate, regenerate and e-mail cases. */
export const CASE_AUTHORS: readonly Role[] = EDITORS;

function asApiError(caught: unknown): ApiError {
  return caught instanceof ApiError ? caught : new ApiError(0, 'client', caught instanceof Error ? caught.message : String(caught));
}

/** Whether a case still waits for a decision. */
export function isOpen(summary: Pick<CaseSummary, 'status'>): boolean {
  return summary.status === 'draft' || summary.status === 'sent';
}

export function useCasePermissions(current: Ref<Pick<CaseSummary, 'status'> | null>) {
  const session = useSessionStore();
  const canAuthor = computed(() => session.hasRole(...CASE_AUTHORS));
  const isDecider = computed(() => session.hasRole(...CASE_DECIDERS));
  const canDecide = computed(() => isDecider.value && current.value !== null && isOpen(current.value));
  /** Why the decision buttons are disabled, in a sentence; '' when they are enabled. */
  const decisionBlockedReason = computed(() => {
    if (!isDecider.value) return 'An approver of the organisation approves or rejects it here; the buttons show for that role only.';
    if (current.value && !isOpen(current.value)) return 'A decision has been recorded on this version.';
    return '';
  });
  return { canAuthor, isDecider, canDecide, decisionBlockedReason };
}

export function useBusinessCase(id: Ref<number>) {
  const current = shallowRef<CaseOutput | null>(null);
  const loading = ref(false);
  const error = shallowRef<ApiError | null>(null);
  const busy = ref<'send' | 'decide' | 'regenerate' | null>(null);

  async function load(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      current.value = await casesApi.get(id.value);
    } catch (caught) {
      current.value = null;
      error.value = asApiError(caught);
    } finally {
      loading.value = false;
    }
  }

  /** Replace the summary fields of the loaded snapshot with a fresher summary from the server. */
  function mergeSummary(summary: CaseSummary): void {
    if (current.value && current.value.id === summary.id) current.value = { ...current.value, ...summary };
  }

  /** E-mail the case (the PDF attached) to the approvers and the extra addresses. Throws ApiError. */
  async function send(body: CaseSend) {
    busy.value = 'send';
    try {
      const sent = await casesApi.send(id.value, body);
      mergeSummary(sent.case);
      if (current.value) current.value = { ...current.value, sends: [...current.value.sends, sent.send] };
      return sent;
    } catch (caught) {
      throw asApiError(caught);
    } finally {
      busy.value = null;
    }
  }

  /** Record the approver's decision. Throws ApiError. */
  async function decide(body: CaseDecisionInput) {
    busy.value = 'decide';
    try {
      const decided = await casesApi.decide(id.value, body);
      mergeSummary(decided.case);
      return decided;
    } catch (caught) {
      throw asApiError(caught);
    } finally {
      busy.value = null;
    }
  }

  /** A new snapshot of the same scope, computed from today's register. Throws ApiError. */
  async function regenerate(): Promise<CaseOutput> {
    const snapshot = current.value;
    if (!snapshot) throw new ApiError(0, 'client', 'The case is not loaded yet.');
    busy.value = 'regenerate';
    try {
      return await casesApi.create(snapshot.scope === 'all' || snapshot.siteId === null ? { all: true } : { siteId: snapshot.siteId });
    } catch (caught) {
      throw asApiError(caught);
    } finally {
      busy.value = null;
    }
  }

  function exportUrl(format: CaseExportFormat): string {
    return casesApi.exportUrl(id.value, format);
  }

  return { current, loading, error, busy, load, send, decide, regenerate, exportUrl };
}

/** The other versions of the same scope (the same site, or the whole organisation), newest first. */
export function useCaseVersions(current: Ref<CaseSummary | null>) {
  const versions = shallowRef<CaseSummary[]>([]);
  const loading = ref(false);

  async function load(): Promise<void> {
    const summary = current.value;
    if (!summary) return;
    loading.value = true;
    try {
      const list = await casesApi.list({
        scope: summary.scope,
        siteId: summary.scope === 'site' ? (summary.siteId ?? undefined) : undefined,
        sort: '-version',
        pageSize: 100,
      });
      versions.value = list.items;
    } catch {
      // The switcher is a convenience: without it the report still reads.
      versions.value = [];
    } finally {
      loading.value = false;
    }
  }

  return { versions, loading, load };
}
