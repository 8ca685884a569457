// Organisation settings (`/api/settings`): price book, assumptions, BLDC material library.
import type { z } from 'zod';
import type {
  MaterialCreate,
  MaterialOutput,
  SettingsOutput,
  assumptionsUpdateBody,
  materialUpdateBody,
  priceBookUpdateBody,
} from 'shared/settings';
import { api } from './client';

export type PriceBookUpdate = z.input<typeof priceBookUpdateBody>;
export type AssumptionsUpdate = z.input<typeof assumptionsUpdateBody>;
export type MaterialUpdate = z.input<typeof materialUpdateBody>;

export const settingsApi = {
  get: () => api.get<SettingsOutput>('/api/settings'),
  savePriceBook: (body: PriceBookUpdate) => api.put<SettingsOutput>('/api/settings/price-book', body),
  saveAssumptions: (body: AssumptionsUpdate) => api.put<SettingsOutput>('/api/settings/assumptions', body),
  createMaterial: (body: MaterialCreate) => api.post<MaterialOutput>('/api/settings/materials', body),
  updateMaterial: (id: number, body: MaterialUpdate) => api.patch<MaterialOutput>(`/api/settings/materials/${id}`, body),
  removeMaterial: (id: number, version: number) => api.request<void>('DELETE', `/api/settings/materials/${id}`, { query: { version } }),
};
