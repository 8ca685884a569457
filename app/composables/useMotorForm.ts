// The Motor form: load the motor (or start a new one on a site), validate with the server's own
// schema, save with the version that was loaded, and say so plainly when someone saved first.
import { computed, ref, watch } from 'vue';
import { motorCreateBody, REQUIRED_MOTOR_FIELDS, type MotorCreate, type MotorOutput } from 'shared/motor';
import { draftToInput, emptyMotorDraft, motorToDraft, starterProfile, type MotorDraft } from 'components/motor-form';
import { MOTOR_FIELD_LABELS } from 'components/motor-labels';
import { ApiError } from 'src/api/client';
import { useMotorStore } from 'stores/motor-store';
import { errorMessage } from './useNotify';
import { useSiteOptions } from './useSiteOptions';
import { useZodForm } from './useZodForm';

export type SaveOutcome = { saved: MotorOutput } | { stale: true } | { fieldErrors: true } | { invalid: true } | { error: unknown };

export const MOTOR_FORM_LABELS: Record<string, string> = {
  ...MOTOR_FIELD_LABELS,
  'dutyProfile.fraction': 'Load',
  'dutyProfile.hours': 'Hours',
};

export function useMotorForm(id: number | null, initialSiteId: number | null = null) {
  const motors = useMotorStore();
  const sites = useSiteOptions();
  const form = useZodForm(motorCreateBody, MOTOR_FORM_LABELS);
  const draft = ref<MotorDraft>(emptyMotorDraft());
  const loaded = ref<MotorOutput | null>(null);
  const loading = ref(false);
  const loadError = ref<string | null>(null);
  const saving = ref(false);
  const stale = ref(false);
  const isNew = computed(() => id === null);

  async function load(fresh: boolean): Promise<void> {
    loading.value = true;
    loadError.value = null;
    try {
      await sites.load();
      if (id === null) {
        const site = sites.byId(initialSiteId) ?? (sites.sites.value.length === 1 ? sites.sites.value[0] : null);
        draft.value = emptyMotorDraft(site ? { id: site.id, voltageV: site.voltageV, frequencyHz: site.frequencyHz } : null);
      } else {
        loaded.value = await motors.load(id, fresh);
        draft.value = motorToDraft(loaded.value);
      }
    } catch (error) {
      loadError.value = `The motor could not be loaded: ${errorMessage(error)}`;
    } finally {
      loading.value = false;
    }
  }

  // A new motor takes its site's supply until the user types another.
  watch(
    () => draft.value.siteId,
    (siteId, previous) => {
      if (!isNew.value || siteId === previous) return;
      const site = sites.byId(siteId);
      const before = sites.byId(previous);
      if (!site) return;
      if (draft.value.voltageV === null || draft.value.voltageV === before?.voltageV) draft.value.voltageV = site.voltageV;
      if (draft.value.frequencyHz === null || draft.value.frequencyHz === before?.frequencyHz) draft.value.frequencyHz = site.frequencyHz;
    },
  );

  /** Switch between one load factor and a duty profile; a first profile starts from three bins. */
  function setUsage(mode: MotorDraft['usage']): void {
    draft.value.usage = mode;
    if (mode === 'duty-profile' && draft.value.dutyProfile.length === 0) draft.value.dutyProfile = starterProfile(draft.value.hoursPerYear);
    form.clear('dutyProfile');
    form.clear('loadFactor');
  }

  async function reload(): Promise<void> {
    stale.value = false;
    form.clear();
    await load(true);
  }

  async function save(): Promise<SaveOutcome> {
    const raw = draftToInput(draft.value);
    const input = form.validate(raw) as MotorCreate | null;
    if (!input) {
      // The shared schema says "must be a number" for a blank number; on a form, blank means missing.
      for (const field of ['siteId', ...REQUIRED_MOTOR_FIELDS]) {
        if (raw[field] === undefined && form.hasError(field)) form.errors.value[field] = `${MOTOR_FORM_LABELS[field] ?? field} is required`;
      }
      return { invalid: true };
    }
    saving.value = true;
    try {
      const saved =
        id === null || !loaded.value
          ? await motors.create(input)
          : await motors.update(id, { ...input, version: loaded.value.version });
      loaded.value = saved;
      return { saved };
    } catch (error) {
      if (error instanceof ApiError && error.isStaleVersion) {
        stale.value = true;
        return { stale: true };
      }
      if (error instanceof ApiError && form.applyServerError(error)) return { fieldErrors: true };
      return { error };
    } finally {
      saving.value = false;
    }
  }

  return { draft, loaded, loading, loadError, saving, stale, isNew, form, sites, load, reload, save, setUsage };
}
