// The Quick study's state: the draft being edited, the live result computed in the browser with
// calc's `assess` (debounced), where the study came from (scratch, a register motor, a saved study),
// and saving — the server recomputes and stores, and the page then shows the stored result.
import { computed, ref, shallowRef, watch } from 'vue';
import type { AssessResult } from 'calc/assess/assess';
import type { AssessInput as ParsedInput } from 'calc/assess/schema';
import { settingsApi } from 'src/api/settings';
import { studiesApi } from 'src/api/studies';
import { blankDraft, computeLive, inputToDraft, type LiveOutcome, type StudyDraft } from 'components/quick-study';

export const LIVE_DEBOUNCE_MS = 150;

export type StudySource =
  | { kind: 'scratch' }
  | { kind: 'motor'; motorId: number; tag: string; sources: string[] }
  | { kind: 'study'; studyId: number; name: string; motorId: number | null };

/** The stored result of a saved study, with the input it was computed from (as JSON, to notice edits). */
interface StoredResult {
  id: number;
  name: string;
  result: AssessResult;
  inputJson: string;
}

export function useQuickStudy() {
  const draft = ref<StudyDraft>(blankDraft());
  const live = shallowRef<LiveOutcome>({ input: null, result: null, errors: {} });
  const source = ref<StudySource>({ kind: 'scratch' });
  const stored = shallowRef<StoredResult | null>(null);
  const loading = ref(false);
  const loadError = ref<string | null>(null);
  const saving = ref(false);
  /** True between an edit and the recomputation it triggers. */
  const pending = ref(false);

  let timer: ReturnType<typeof setTimeout> | null = null;

  function recompute(): void {
    if (timer !== null) clearTimeout(timer);
    timer = null;
    pending.value = false;
    live.value = computeLive(draft.value);
  }

  function schedule(): void {
    pending.value = true;
    if (timer !== null) clearTimeout(timer);
    timer = setTimeout(recompute, LIVE_DEBOUNCE_MS);
  }

  // Synchronous, so that a draft replaced and recomputed at once (load, new) leaves nothing pending.
  watch(draft, schedule, { deep: true, flush: 'sync' });

  const liveInputJson = computed(() => (live.value.input ? JSON.stringify(live.value.input) : null));
  /** The stored result while the inputs are those it was computed from. */
  const storedCurrent = computed(() => (stored.value && !pending.value && stored.value.inputJson === liveInputJson.value ? stored.value : null));
  /** What the page shows: the stored result when it is current, else the live one. */
  const result = computed<AssessResult | null>(() => storedCurrent.value?.result ?? live.value.result);
  const input = computed<ParsedInput | null>(() => live.value.input);
  /** The stored result equals the live computation (the same calc on both sides). */
  const storedMatchesLive = computed(
    () => !!storedCurrent.value && !!live.value.result && JSON.stringify(storedCurrent.value.result) === JSON.stringify(live.value.result),
  );

  /** A fresh study with the organisation's stored price book and assumptions (as the server would add them). */
  async function startBlank(): Promise<void> {
    loadError.value = null;
    stored.value = null;
    source.value = { kind: 'scratch' };
    const next = blankDraft();
    try {
      const settings = await settingsApi.get();
      next.priceBook = settings.priceBook.stored;
      next.assumptions = settings.assumptions.stored;
    } catch {
      // Settings unreadable: calc's defaults apply, and the assumptions list says so.
    }
    draft.value = next;
    recompute();
  }

  async function loadMotor(motorId: number): Promise<void> {
    loading.value = true;
    loadError.value = null;
    try {
      const preview = await studiesApi.fromMotor(motorId);
      stored.value = null;
      draft.value = inputToDraft(preview.input);
      source.value = { kind: 'motor', motorId, tag: preview.input.motor.tag ?? `#${motorId}`, sources: preview.sources };
      recompute();
    } catch (error) {
      loadError.value = error instanceof Error ? error.message : String(error);
    } finally {
      loading.value = false;
    }
  }

  async function loadStudy(studyId: number): Promise<void> {
    loading.value = true;
    loadError.value = null;
    try {
      const study = await studiesApi.get(studyId);
      draft.value = inputToDraft(study.input);
      source.value = { kind: 'study', studyId, name: study.name, motorId: study.motorId };
      recompute();
      stored.value = { id: study.id, name: study.name, result: study.result, inputJson: JSON.stringify(live.value.input) };
    } catch (error) {
      loadError.value = error instanceof Error ? error.message : String(error);
    } finally {
      loading.value = false;
    }
  }

  /** Saves the current inputs; answers the new study's id. */
  async function save(name: string): Promise<number | null> {
    recompute();
    const parsed = live.value.input;
    if (!parsed || !live.value.result) return null;
    saving.value = true;
    try {
      const motorId = source.value.kind === 'motor' ? source.value.motorId : source.value.kind === 'study' ? source.value.motorId : null;
      const created = await studiesApi.create({ ...parsed, name, ...(motorId !== null ? { motorId } : {}) });
      const { id, ...result } = created;
      stored.value = { id, name, result, inputJson: JSON.stringify(parsed) };
      source.value = { kind: 'study', studyId: id, name, motorId };
      return id;
    } finally {
      saving.value = false;
    }
  }

  function applyLoadFactor(loadFactor: number): void {
    draft.value.motor.loadFactor = Math.round(loadFactor * 1000) / 1000;
    if (draft.value.motor.application !== 'fan' && draft.value.motor.application !== 'pump') draft.value.motor.loadMode = 'single';
  }

  return {
    draft,
    live,
    input,
    result,
    source,
    stored,
    storedCurrent,
    storedMatchesLive,
    loading,
    loadError,
    saving,
    pending,
    recompute,
    startBlank,
    loadMotor,
    loadStudy,
    save,
    applyLoadFactor,
  };
}
