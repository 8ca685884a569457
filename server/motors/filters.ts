/** The register's filters → a Sequelize where clause, shared by the list and the export. */
import { Op, literal, where as sqlWhere, type WhereOptions } from 'sequelize';
import type { Motor } from '../models/index.js';
import type { z } from 'zod';
import type { motorFilterShape } from '../shared/motor.js';

type Filters = { [K in keyof typeof motorFilterShape]?: z.infer<(typeof motorFilterShape)[K]> };

/**
 * The text `q` searches. Must stay equal to the expression of the trigram index
 * (migrations/20261201140600-add-motors-search-index.ts) for the planner to use it.
 */
export const MOTOR_SEARCH_EXPRESSION =
  "lower(tag || ' ' || coalesce(description, '') || ' ' || coalesce(area, '') || ' ' || coalesce(manufacturer, ''))";

export function motorWhere(filters: Filters): WhereOptions<Motor> {
  const conditions: unknown[] = [];
  const and: Record<string, unknown> = {};
  if (filters.q) {
    const pattern = `%${filters.q.toLowerCase().replace(/[%_\\]/g, '\\$&')}%`;
    conditions.push(sqlWhere(literal(MOTOR_SEARCH_EXPRESSION), { [Op.like]: pattern }));
  }
  if (filters.siteId?.length) and.siteId = { [Op.in]: filters.siteId };
  if (filters.area) and.area = { [Op.iLike]: filters.area.replace(/[%_\\]/g, '\\$&') };
  if (filters.application?.length) and.application = { [Op.in]: filters.application };
  if (filters.efficiencyClass?.length) and.efficiencyClass = { [Op.in]: filters.efficiencyClass };
  if (filters.controlMethod?.length) and.controlMethod = { [Op.in]: filters.controlMethod };
  and.status = filters.status?.length ? { [Op.in]: filters.status } : { [Op.ne]: 'retired' };
  const power: Record<symbol, number> = {};
  if (filters.minKw !== undefined) power[Op.gte] = filters.minKw;
  if (filters.maxKw !== undefined) power[Op.lte] = filters.maxKw;
  if (Object.getOwnPropertySymbols(power).length > 0) and.ratedPowerKw = power;
  return (conditions.length > 0 ? { ...and, [Op.and]: conditions } : and) as WhereOptions<Motor>;
}
