// kW or hp, as each user prefers: remembered per user in localStorage, shared by every screen of
// the session. The API and the database stay in kW; only what is shown and typed is converted.
import { computed, ref, watch, type Ref } from 'vue';
import { useSessionStore } from 'stores/session-store';
import { formatNumber } from 'src/utils/format';

export type PowerUnit = 'kW' | 'hp';
export const POWER_UNITS: readonly PowerUnit[] = ['kW', 'hp'];

/** Mechanical horsepower [kW/hp] (1 hp = 745.7 W). */
export const KW_PER_HP = 0.7457;

export const kwToHp = (kw: number): number => kw / KW_PER_HP;
export const hpToKw = (hp: number): number => hp * KW_PER_HP;

/** A power in kW expressed in `unit`. */
export function fromKw(kw: number, unit: PowerUnit): number {
  return unit === 'hp' ? kwToHp(kw) : kw;
}

/** A power typed in `unit`, in kW (rounded to 0.1 W so 10 hp is 7.457 kW, not 7.45700000001). */
export function toKw(value: number, unit: PowerUnit): number {
  const kw = unit === 'hp' ? hpToKw(value) : value;
  return Math.round(kw * 1e4) / 1e4;
}

/** "7.5 kW" or "10.1 hp": one decimal below 100, whole numbers above. */
export function formatPower(kw: number | null | undefined, unit: PowerUnit): string {
  if (kw === null || kw === undefined || !Number.isFinite(kw)) return '—';
  const value = fromKw(kw, unit);
  return `${formatNumber(value, Math.abs(value) < 100 ? 1 : 0)} ${unit}`;
}

/** The localStorage key of a user's preference. */
export function powerUnitKey(userId: number | null): string {
  return `statorline.powerUnit.${userId ?? 'anonymous'}`;
}

function readUnit(userId: number | null): PowerUnit {
  try {
    const stored = globalThis.localStorage?.getItem(powerUnitKey(userId));
    return stored === 'hp' ? 'hp' : 'kW';
  } catch {
    return 'kW';
  }
}

const current = ref<PowerUnit>('kW');
let loadedFor: number | null | undefined;

export function usePowerUnit() {
  const session = useSessionStore();
  const userId = computed(() => session.user?.id ?? null);
  if (loadedFor !== userId.value) {
    loadedFor = userId.value;
    current.value = readUnit(userId.value);
  }
  watch(userId, (id) => {
    loadedFor = id;
    current.value = readUnit(id);
  });

  const unit = computed<PowerUnit>({
    get: () => current.value,
    set: (next) => {
      current.value = next;
      try {
        globalThis.localStorage?.setItem(powerUnitKey(userId.value), next);
      } catch {
        // Private mode or full storage: the choice lasts for this page load only.
      }
    },
  });

  return {
    unit: unit as Ref<PowerUnit>,
    format: (kw: number | null | undefined) => formatPower(kw, unit.value),
    fromKw: (kw: number) => fromKw(kw, unit.value),
    toKw: (value: number) => toKw(value, unit.value),
  };
}

/** Only for tests: forget the module's state so the next use reads localStorage again. */
export function resetPowerUnitForTests(): void {
  loadedFor = undefined;
  current.value = 'kW';
}
