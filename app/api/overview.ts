// The organisation's overview figures (`/api/overview`) and the server's health.
import type { OverviewResponse } from 'shared/overview';
import { api } from './client';

export interface HealthResponse {
  status: string;
  database: string;
}

export const overviewApi = {
  get: () => api.get<OverviewResponse>('/api/overview'),
  health: () => api.get<HealthResponse>('/api/health'),
};
