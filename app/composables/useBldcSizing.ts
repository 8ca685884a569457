// State of the BLDC sizing page: the inputs, the design shown (saved on the server or previewed in
// the browser), the motor it is for, the material library, and the actions (design, preview, open a
// stored design, use it for a motor).
import { computed, reactive, ref } from 'vue';
import { LAMINATION_STEELS, MAGNET_GRADES } from 'calc/bldc/materials';
import { ApiError } from 'src/api/client';
import { bldcMaterialsApi, bldcMotorsApi, designsApi } from 'src/api/designs';
import { errorMessage } from 'composables/useNotify';
import { useZodForm } from 'composables/useZodForm';
import { BldcWorkerError, useBldcDesignWorker, workersAvailable } from 'composables/useBldcWorkers';
import { designCreateBody, type BldcResult, type SizeBldcInput } from 'shared/design';
import type { MotorOutput } from 'shared/motor';
import type { MagnetOutput, SteelOutput } from 'shared/settings';
import { emptyForm, FIELD_LABELS, formFromInput, formFromMotor, requestFromForm, type BldcForm } from 'components/bldc-sizing';

export interface ShownDesign {
  /** Saved on the server (with id) or computed in the browser only. */
  source: 'saved' | 'preview';
  id: number | null;
  name: string;
  motorId: number | null;
  linkedMotorIds: number[];
  appliedDefaults: string[];
  createdByName: string | null;
  createdAt: string | null;
  /** The size-bldc request that produced the result (the sweep starts from it). */
  input: SizeBldcInput;
}

interface MaterialChoice {
  name: string;
  builtIn: boolean;
  detail: string;
  /** The material as calc takes it (custom ones are sent whole to the browser preview). */
  value: Record<string, unknown>;
}

function stripLibraryFields(material: MagnetOutput | SteelOutput): Record<string, unknown> {
  const { id: _id, kind: _kind, builtIn: _builtIn, version: _version, ...rest } = material;
  return rest;
}

export function useBldcSizing() {
  const form = reactive<BldcForm>(emptyForm());
  const result = ref<BldcResult | null>(null);
  const shown = ref<ShownDesign | null>(null);
  const motor = ref<MotorOutput | null>(null);
  const loading = ref(false);
  const loadError = ref<string | null>(null);
  const designing = ref(false);
  const actionError = ref<string | null>(null);
  const magnets = ref<MaterialChoice[]>([]);
  const steels = ref<MaterialChoice[]>([]);
  const materialsNote = ref<string | null>(null);
  const validation = useZodForm(designCreateBody, FIELD_LABELS);
  const worker = useBldcDesignWorker();
  const previewing = worker.running;

  async function loadMaterials(): Promise<void> {
    try {
      const library = await bldcMaterialsApi.get();
      magnets.value = library.magnets.map((m) => ({ name: m.name, builtIn: m.builtIn, detail: `Br ${m.remanenceT} T, up to ${m.maxTemperatureC} °C`, value: stripLibraryFields(m) }));
      steels.value = library.steels.map((s) => ({ name: s.name, builtIn: s.builtIn, detail: `${(s.thicknessM * 1000).toFixed(2)} mm`, value: stripLibraryFields(s) }));
      materialsNote.value = null;
    } catch {
      magnets.value = MAGNET_GRADES.map((m) => ({ name: m.name, builtIn: true, detail: `Br ${m.remanenceT} T, up to ${m.maxTemperatureC} °C`, value: { ...m } }));
      steels.value = LAMINATION_STEELS.map((s) => ({ name: s.name, builtIn: true, detail: `${(s.thicknessM * 1000).toFixed(2)} mm`, value: { ...s } }));
      materialsNote.value = 'The organisation’s material library could not be loaded: the built-in grades are listed.';
    }
  }

  async function loadMotor(id: number, fillForm: boolean): Promise<void> {
    motor.value = await bldcMotorsApi.get(id);
    if (fillForm) Object.assign(form, formFromMotor(motor.value, emptyForm()));
  }

  /** Opens the page for `?designId=` and/or `?motorId=`. */
  async function open(designId: number | null, motorId: number | null): Promise<void> {
    loading.value = true;
    loadError.value = null;
    actionError.value = null;
    try {
      if (designId !== null) {
        if (shown.value?.id !== designId) {
          const design = await designsApi.get(designId);
          Object.assign(form, formFromInput(design.input, design.name));
          result.value = design.result;
          shown.value = {
            source: 'saved',
            id: design.id,
            name: design.name,
            motorId: design.motorId,
            linkedMotorIds: design.linkedMotorIds,
            appliedDefaults: design.appliedDefaults,
            createdByName: design.createdByName,
            createdAt: design.createdAt,
            input: cleanInput(design.input),
          };
        }
        const forMotor = motorId ?? shown.value?.motorId ?? null;
        if (forMotor !== null && motor.value?.id !== forMotor) await loadMotor(forMotor, false).catch(() => undefined);
      } else if (motorId !== null) {
        if (motor.value?.id !== motorId) {
          await loadMotor(motorId, true);
          result.value = null;
          shown.value = null;
        }
      }
    } catch (error) {
      loadError.value = error instanceof ApiError && error.status === 404
        ? `${designId !== null ? 'This design' : 'This motor'} was not found: it may have been removed, or it belongs to another organisation.`
        : `The ${designId !== null ? 'design' : 'motor'} could not be loaded: ${errorMessage(error)}`;
    } finally {
      loading.value = false;
    }
  }

  function cleanInput(input: Record<string, unknown>): SizeBldcInput {
    const { name: _name, motorId: _motorId, ...rest } = input;
    return rest as SizeBldcInput;
  }

  /** The request for the browser: custom materials sent whole (the server resolves them by name). */
  function forBrowser(request: SizeBldcInput): SizeBldcInput {
    const next: Record<string, unknown> = { ...request };
    const magnet = magnets.value.find((m) => m.name === request.magnet);
    const steel = steels.value.find((s) => s.name === request.steel);
    if (magnet && !magnet.builtIn) next.magnet = magnet.value;
    if (steel && !steel.builtIn) next.steel = steel.value;
    return next as SizeBldcInput;
  }

  const sweepBase = computed<SizeBldcInput | null>(() => {
    if (!shown.value || !result.value?.slots || !result.value.poles) return null;
    return forBrowser({ ...shown.value.input, slots: result.value.slots, poles: result.value.poles, ...(result.value.coilPitch !== undefined ? { coilPitch: result.value.coilPitch } : {}) });
  });

  function validated(): SizeBldcInput | null {
    const request = requestFromForm(form);
    const body = { ...request, ...(form.name.trim() ? { name: form.name.trim() } : {}), ...(motor.value ? { motorId: motor.value.id } : {}) };
    const parsed = validation.validate(body);
    return parsed ? request : null;
  }

  /** Sizes on the server and saves; answers the new id. */
  async function design(): Promise<number | null> {
    actionError.value = null;
    const request = validated();
    if (!request) return null;
    designing.value = true;
    try {
      const name = form.name.trim();
      const created = await designsApi.create({ ...request, ...(name ? { name } : {}), ...(motor.value ? { motorId: motor.value.id } : {}) });
      const { id, appliedDefaults, ...rest } = created;
      result.value = rest as BldcResult;
      shown.value = {
        source: 'saved',
        id,
        name: name || `Design #${id}`,
        motorId: motor.value?.id ?? null,
        linkedMotorIds: [],
        appliedDefaults,
        createdByName: null,
        createdAt: new Date().toISOString(),
        input: request,
      };
      // The stored input (after server defaults) is what the sweep must start from.
      designsApi.get(id).then((stored) => {
        if (shown.value?.id === id) shown.value = { ...shown.value, name: stored.name, input: cleanInput(stored.input), createdByName: stored.createdByName, createdAt: stored.createdAt };
      }, () => undefined);
      return id;
    } catch (error) {
      if (!(error instanceof ApiError && validation.applyServerError(error))) actionError.value = `The design could not be made: ${errorMessage(error)}`;
      else actionError.value = 'Check the marked inputs.';
      return null;
    } finally {
      designing.value = false;
    }
  }

  /** Sizes in the browser (a worker), without saving. */
  async function preview(): Promise<void> {
    actionError.value = null;
    const request = validated();
    if (!request) return;
    if (!workersAvailable()) {
      actionError.value = 'This browser cannot run background workers: use Design.';
      return;
    }
    try {
      result.value = await worker.size(forBrowser(request));
      shown.value = { source: 'preview', id: null, name: 'Preview (not saved)', motorId: motor.value?.id ?? null, linkedMotorIds: [], appliedDefaults: [], createdByName: null, createdAt: null, input: request };
    } catch (error) {
      if (error instanceof BldcWorkerError && error.field) {
        const label = FIELD_LABELS[error.field];
        validation.errors.value = { [error.field]: `${label ?? error.field} ${error.message.replace(/^"[^"]*" /, '')}` };
        actionError.value = 'Check the marked inputs.';
      } else if (!(error instanceof BldcWorkerError && error.message === 'Stopped.')) {
        actionError.value = `The preview failed: ${errorMessage(error)}`;
      }
    }
  }

  /** Applies the nearest feasible alternative's change to the inputs. */
  function applyAlternative(field: string, value: string | number): void {
    if (field === 'frame' && typeof value === 'string') {
      form.frameMode = value.toUpperCase().endsWith('T') ? 'nema' : 'iec';
      form.frame = value;
    } else if (field === 'magnet' && typeof value === 'string') form.magnet = value;
    else if ((field === 'maxStackLengthMm' || field === 'maxStatorOuterDiameterMm') && typeof value === 'number') {
      if (form.frameMode !== 'free') {
        const limits = result.value?.frame;
        form.frameMode = 'free';
        form.maxStatorOuterDiameterMm = limits ? Math.floor(limits.maxStatorOuterDiameterMm) : form.maxStatorOuterDiameterMm;
        form.maxStackLengthMm = limits ? Math.floor(limits.maxStackLengthMm) : form.maxStackLengthMm;
      }
      form[field] = Math.ceil(value);
    }
  }

  return {
    form,
    result,
    shown,
    motor,
    loading,
    loadError,
    designing,
    previewing,
    actionError,
    magnets,
    steels,
    materialsNote,
    errors: validation.errors,
    sweepBase,
    loadMaterials,
    open,
    design,
    preview,
    applyAlternative,
    stopPreview: worker.stop,
  };
}
