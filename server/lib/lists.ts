/** Helpers for the list conventions: `sort` → ORDER BY, page → LIMIT/OFFSET. */
import type { Order } from 'sequelize';

export function orderFrom(sort: string, tieBreaker = 'id'): Order {
  const descending = sort.startsWith('-');
  const field = descending ? sort.slice(1) : sort;
  return [[field, descending ? 'DESC' : 'ASC'], [tieBreaker, 'ASC']];
}

export function pageWindow(page: number, pageSize: number): { limit: number; offset: number } {
  return { limit: pageSize, offset: (page - 1) * pageSize };
}
