/**
 * What a business case (or the Overview) assesses: the register's motors in service at the given
 * sites, each turned into calc's assess input by issue 7's `assessInputForMotor` (site tariff, the
 * organisation's Settings, the linked BLDC design's curve). The result is plain JSON, stored as the
 * snapshot's `inputs`, so the figures can always be traced to exactly what was assessed.
 */
import { Op } from 'sequelize';
import { BldcDesign, Motor, type Site } from '../models/index.js';
import type { CaseInputs } from '../models/business-case.js';
import { storedAssessSettings } from '../settings/service.js';
import { assessInputForMotor, siteInput } from '../studies/motor-input.js';

export async function registerInputs(organizationId: number, sites: readonly Site[]): Promise<CaseInputs> {
  const siteById = new Map(sites.map((site) => [site.id, site]));
  // raw: thousands of motors; the builder only reads attributes.
  const motors = (await Motor.findAll({
    where: { organizationId, siteId: { [Op.in]: [...siteById.keys()] }, status: { [Op.ne]: 'retired' } },
    order: [['tag', 'ASC'], ['id', 'ASC']],
    raw: true,
  })) as unknown as Motor[];
  const designIds = [...new Set(motors.map((motor) => motor.bldcDesignId).filter((id): id is number => id !== null && id !== undefined))];
  const designs = new Map(
    (designIds.length > 0 ? await BldcDesign.findAll({ where: { organizationId, id: { [Op.in]: designIds } } }) : []).map((design) => [design.id, design]),
  );
  const settings = await storedAssessSettings({ organizationId });
  let withCurve = 0;
  let withInfeasibleDesign = 0;
  const motorInputs: CaseInputs['motors'] = motors.map((motor) => {
    const design = motor.bldcDesignId == null ? null : (designs.get(motor.bldcDesignId) ?? null);
    const { input, bldcDesignId } = assessInputForMotor(motor, siteById.get(motor.siteId)!, settings, design);
    if (bldcDesignId !== null) withCurve += 1;
    else if (design) withInfeasibleDesign += 1;
    return { id: motor.id, siteId: motor.siteId, tag: motor.tag, bldcDesignId, version: motor.version, input: input.motor };
  });
  const sources = [
    `motors: ${motors.length} register motors in service (retired motors left out), as stored when the case was generated`,
    ...sites.map((site) => `site ${site.name}: ${site.timeOfUse && site.timeOfUse.length > 0 ? 'time-of-use tariff' : 'flat energy price'}, demand charge, CO2 factor and default hours from the site record`),
    settings.priceBook ? 'price book: the organisation’s Settings (missing parts: calc defaults)' : 'price book: calc defaults (none stored in Settings)',
    settings.assumptions ? 'assumptions: the organisation’s Settings (missing ones: calc defaults)' : 'assumptions: calc defaults (none stored in Settings)',
    `BLDC options: the linked design’s part-load curve for ${withCurve} motors${withInfeasibleDesign > 0 ? `, generic model for ${withInfeasibleDesign} motors whose linked design is not feasible` : ''}, the generic permanent-magnet model for the others`,
  ];
  return {
    sites: sites.map((site) => ({ id: site.id, name: site.name, currency: site.currency, input: siteInput(site) })),
    motors: motorInputs,
    priceBook: settings.priceBook ?? null,
    assumptions: settings.assumptions ?? null,
    sources,
  };
}
