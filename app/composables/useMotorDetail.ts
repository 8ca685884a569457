// One motor with everything around it: measurements, files (upload with progress) and history.
import { ref, shallowRef } from 'vue';
import type { MeasurementCreate, MeasurementOutput, MotorFileOutput, MotorHistoryItem } from 'shared/motor';
import { motorsApi, type MotorFileKind } from 'src/api/motors';
import { useMotorStore } from 'stores/motor-store';
import { errorMessage } from './useNotify';

export const HISTORY_PAGE_SIZE = 20;

export interface UploadState {
  fileName: string;
  progress: number;
}

export function useMotorDetail(id: number) {
  const motors = useMotorStore();
  const loadError = ref<string | null>(null);
  const measurements = shallowRef<MeasurementOutput[]>([]);
  const measurementsError = ref<string | null>(null);
  const files = shallowRef<MotorFileOutput[]>([]);
  const filesError = ref<string | null>(null);
  const history = shallowRef<MotorHistoryItem[]>([]);
  const historyTotal = ref(0);
  const historyError = ref<string | null>(null);
  const historyLoading = ref(false);
  const upload = ref<UploadState | null>(null);

  async function loadMotor(fresh = true): Promise<void> {
    loadError.value = null;
    try {
      await motors.load(id, fresh);
    } catch (error) {
      loadError.value = `The motor could not be loaded: ${errorMessage(error)}`;
    }
  }

  async function loadMeasurements(): Promise<void> {
    measurementsError.value = null;
    try {
      measurements.value = (await motorsApi.measurements(id)).items;
    } catch (error) {
      measurementsError.value = errorMessage(error);
    }
  }

  async function loadFiles(): Promise<void> {
    filesError.value = null;
    try {
      files.value = (await motorsApi.files(id)).items;
    } catch (error) {
      filesError.value = errorMessage(error);
    }
  }

  /** The first page of history, or the next one appended (`more`). */
  async function loadHistory(more = false): Promise<void> {
    historyError.value = null;
    historyLoading.value = true;
    try {
      const page = more ? Math.floor(history.value.length / HISTORY_PAGE_SIZE) + 1 : 1;
      const result = await motorsApi.history(id, page, HISTORY_PAGE_SIZE);
      history.value = more ? [...history.value, ...result.items] : result.items;
      historyTotal.value = result.total;
    } catch (error) {
      historyError.value = errorMessage(error);
    } finally {
      historyLoading.value = false;
    }
  }

  async function loadAll(): Promise<void> {
    await Promise.all([loadMotor(true), loadMeasurements(), loadFiles(), loadHistory()]);
  }

  async function addMeasurement(body: MeasurementCreate): Promise<MeasurementOutput> {
    const created = await motorsApi.addMeasurement(id, body);
    await Promise.all([loadMeasurements(), loadHistory()]);
    return created;
  }

  async function uploadFile(file: File, kind: MotorFileKind): Promise<MotorFileOutput> {
    upload.value = { fileName: file.name, progress: 0 };
    try {
      const created = await motorsApi.uploadFile(id, file, kind, {
        onProgress: (fraction) => {
          if (upload.value) upload.value = { ...upload.value, progress: fraction };
        },
      });
      await Promise.all([loadFiles(), loadHistory()]);
      return created;
    } finally {
      upload.value = null;
    }
  }

  async function retire(): Promise<void> {
    const motor = motors.current;
    if (!motor || motor.id !== id) return;
    await motors.retire(motor);
    await loadHistory();
  }

  return {
    motors,
    loadError,
    measurements,
    measurementsError,
    files,
    filesError,
    history,
    historyTotal,
    historyError,
    historyLoading,
    upload,
    loadMotor,
    loadMeasurements,
    loadFiles,
    loadHistory,
    loadAll,
    addMeasurement,
    uploadFile,
    retire,
  };
}
