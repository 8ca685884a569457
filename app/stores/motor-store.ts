// The motor being looked at or edited. The register pages through useMotorRegister; this store
// holds one motor so the detail and the form share it (no second request between the two).
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { MotorCreate, MotorOutput } from 'shared/motor';
import { motorsApi, type MotorUpdate } from 'src/api/motors';

export const useMotorStore = defineStore('motor', () => {
  const current = ref<MotorOutput | null>(null);
  const loading = ref(false);

  /** Load a motor, reusing the one in hand unless `fresh` is asked for. */
  async function load(id: number, fresh = false): Promise<MotorOutput> {
    if (!fresh && current.value?.id === id) return current.value;
    loading.value = true;
    try {
      current.value = await motorsApi.get(id);
      return current.value;
    } finally {
      loading.value = false;
    }
  }

  async function create(body: MotorCreate): Promise<MotorOutput> {
    current.value = await motorsApi.create(body);
    return current.value;
  }

  /** Save changes; the body carries the version that was loaded (409 if someone saved since). */
  async function update(id: number, body: MotorUpdate): Promise<MotorOutput> {
    current.value = await motorsApi.update(id, body);
    return current.value;
  }

  async function retire(motor: MotorOutput): Promise<MotorOutput> {
    current.value = await motorsApi.retire(motor.id, motor.version);
    return current.value;
  }

  return { current, loading, load, create, update, retire };
});
