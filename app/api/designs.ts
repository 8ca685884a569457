// BLDC designs (`/api/designs`), and the few register and settings reads the BLDC sizing page needs
// (a motor to start from, the material library). Shapes come from server/shared/design.ts.
import type { ListResult } from 'shared/common';
import type {
  DesignCreate,
  DesignCreated,
  DesignListItem,
  DesignOutput,
  DesignSimulate,
  EfficiencyMap,
  SimulateOutput,
  SweepRow,
} from 'shared/design';
import type { MotorOutput } from 'shared/motor';
import type { SettingsOutput } from 'shared/settings';
import { api } from './client';

export interface DesignListQuery {
  page?: number;
  pageSize?: number;
  sort?: string;
  q?: string;
  motorId?: number;
}

export interface SweepRequest {
  base: unknown;
  parameter: string;
  from: number;
  to: number;
  steps: number;
}

export const designsApi = {
  create: (body: DesignCreate) => api.post<DesignCreated>('/api/designs', body),
  list: (query: DesignListQuery = {}) => api.get<ListResult<DesignListItem>>('/api/designs', { ...query }),
  get: (id: number) => api.get<DesignOutput>(`/api/designs/${id}`),
  simulate: (id: number, body: DesignSimulate) => api.post<SimulateOutput>(`/api/designs/${id}/simulate`, body),
  efficiencyMap: (id: number, body: { speedsRpm: number[]; torquesNm: number[] }) =>
    api.post<EfficiencyMap>(`/api/designs/${id}/efficiency-map`, body),
  sweep: (body: SweepRequest) => api.post<{ parameter: string; rows: SweepRow[] }>('/api/designs/sweep', body),
  /** Makes the design the motor's BLDC option (null unlinks). */
  useForMotor: (motorId: number, designId: number | null, version?: number) =>
    api.post<{ motorId: number; designId: number | null; version: number }>(`/api/motors/${motorId}/design`, {
      designId,
      ...(version !== undefined ? { version } : {}),
    }),
};

/** The register reads of this page (the register's own module belongs to the Motor register page). */
export const bldcMotorsApi = {
  get: (id: number) => api.get<MotorOutput>(`/api/motors/${id}`),
  search: (q: string) => api.get<ListResult<MotorOutput>>('/api/motors', { q, pageSize: 20, sort: 'tag' }),
};

/** The organisation's material library (built-in grades and custom ones) from `GET /api/settings`. */
export const bldcMaterialsApi = {
  get: () => api.get<SettingsOutput>('/api/settings').then((settings) => settings.materials),
};
