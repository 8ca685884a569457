import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_DISCOUNT_RATE_PCT } from '../../calc/assess/defaults.js';
import { DEFAULT_PRICE_BOOK } from '../../calc/economics/price-book.js';
import type { Organization } from '../../server/models/index.js';
import { createOrganization, createUser, signIn, startTestApp, type TestContext } from '../support/api.js';

let context: TestContext;
let organization: Organization;
let other: Organization;

const customMagnet = {
  kind: 'magnet',
  name: 'Plant N40 stock',
  family: 'sintered-ndfeb',
  remanenceT: 1.26,
  intrinsicCoercivityAPerM: 1_100_000,
  remanenceTempCoeffPerK: -0.0012,
  coercivityTempCoeffPerK: -0.006,
  recoilPermeability: 1.05,
  maxTemperatureC: 100,
  densityKgPerM3: 7500,
  conductivitySPerM: 670_000,
  pricePerKg: 48,
};

const ie4Bands = [
  { upToKw: 7.5, costPerKw: 95, fixedCost: 200 },
  { upToKw: 1000, costPerKw: 60, fixedCost: 900 },
];

const put = (session: Awaited<ReturnType<typeof signIn>>, path: string) => session.agent.put(path).set('x-csrf-token', session.token);

beforeAll(async () => {
  context = await startTestApp();
  organization = await createOrganization();
  other = await createOrganization();
});
afterAll(async () => context.close());

describe('settings', () => {
  it('answers calc’s defaults, saying which they are, until something is stored', async () => {
    const session = await signIn(context.app, await createUser(organization, 'viewer'));
    const response = await session.get('/api/settings').expect(200);
    expect(response.body.priceBook).toMatchObject({ stored: null, version: 0 });
    expect(response.body.priceBook.value.items).toEqual(DEFAULT_PRICE_BOOK.items);
    expect(response.body.priceBook.defaulted).toEqual(expect.arrayContaining(['items.ie4', 'items.bldc', 'motorInstallation', 'driveInstallation']));
    expect(response.body.assumptions.value.discountRatePct).toBe(DEFAULT_DISCOUNT_RATE_PCT);
    expect(response.body.assumptions.defaulted).toContain('discountRatePct');
    expect(response.body.materials.magnets.find((magnet: { name: string }) => magnet.name === 'N42H')).toMatchObject({ builtIn: true, id: null, kind: 'magnet' });
    expect(response.body.materials.steels.find((steel: { name: string }) => steel.name === 'M330-35A')).toMatchObject({ builtIn: true, kind: 'steel' });
  });

  it('lets an admin replace the price book and the assumptions with the version loaded (409 when stale)', async () => {
    const admin = await signIn(context.app, await createUser(organization, 'admin'));
    const saved = await put(admin, '/api/settings/price-book').send({ currency: 'EUR', items: { ie4: ie4Bands }, version: 0 });
    expect(saved.status).toBe(200);
    expect(saved.body.priceBook).toMatchObject({ version: 1, stored: { currency: 'EUR', items: { ie4: ie4Bands } } });
    expect(saved.body.priceBook.value.items.ie4).toEqual(ie4Bands);
    expect(saved.body.priceBook.value.items.ie3).toEqual(DEFAULT_PRICE_BOOK.items.ie3);
    expect(saved.body.priceBook.defaulted).not.toContain('items.ie4');
    const stale = await put(admin, '/api/settings/price-book').send({ items: {}, version: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale-version');
    const assumptions = await put(admin, '/api/settings/assumptions').send({ discountRatePct: 10, lifeYears: { bldc: 12 }, version: 0 }).expect(200);
    expect(assumptions.body.assumptions).toMatchObject({ version: 1, stored: { discountRatePct: 10, lifeYears: { bldc: 12 } } });
    expect(assumptions.body.assumptions.value.lifeYears).toMatchObject({ bldc: 12, ie4: 20 });
    expect(assumptions.body.assumptions.defaulted).not.toContain('discountRatePct');
    expect(assumptions.body.assumptions.defaulted).toContain('lifeYears.ie4');
    // A study without a price book now uses the organisation's: the IE4 motor costs what the book says.
    const study = await admin
      .post('/api/studies')
      .send({ motor: { ratedPowerKw: 5.5, poles: 4, efficiencyClass: 'IE1', hoursPerYear: 6000 }, site: { voltageV: 400, frequencyHz: 50, energyPricePerKwh: 0.2, currency: 'EUR' } })
      .expect(201);
    expect(study.body.assumptions).toContainEqual({ what: 'price book', value: 'given', source: 'given; missing items from DEFAULT_PRICE_BOOK' });
    // Another organisation still sees calc's defaults.
    const stranger = await signIn(context.app, await createUser(other, 'admin'));
    expect((await stranger.get('/api/settings').expect(200)).body.priceBook.stored).toBeNull();
  });

  it('names the field of an invalid price book or assumption', async () => {
    const admin = await signIn(context.app, await createUser(organization, 'admin'));
    const unsorted = await put(admin, '/api/settings/price-book').send({ items: { ie4: [...ie4Bands].reverse() }, version: 1 });
    expect(unsorted.status).toBe(400);
    expect(unsorted.body.error.message).toBe('items.ie4: must be sorted by upToKw, strictly increasing');
    const rate = await put(admin, '/api/settings/assumptions').send({ discountRatePct: 500, version: 1 });
    expect(rate.body.error.message).toBe('discountRatePct: must be at most 100');
    const missing = await put(admin, '/api/settings/assumptions').send({ discountRatePct: 9 });
    expect(missing.body.error.details[0].field).toBe('version');
  });

  it('keeps the price book and assumptions to admins (403 for everyone else); everyone reads', async () => {
    for (const role of ['engineer', 'approver', 'viewer'] as const) {
      const session = await signIn(context.app, await createUser(organization, role));
      expect((await put(session, '/api/settings/price-book').send({ version: 1 })).status).toBe(403);
      expect((await put(session, '/api/settings/assumptions').send({ version: 1 })).status).toBe(403);
      await session.get('/api/settings').expect(200);
    }
  });

  it('lets engineers keep custom magnets and steels in the material library, checked by calc’s rules', async () => {
    const engineer = await signIn(context.app, await createUser(organization, 'engineer'));
    const created = await engineer.post('/api/settings/materials').send(customMagnet);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ kind: 'magnet', name: 'Plant N40 stock', builtIn: false, version: 0, remanenceT: 1.26, source: 'user material' });
    const duplicate = await engineer.post('/api/settings/materials').send(customMagnet);
    expect(duplicate.status).toBe(409);
    const builtIn = await engineer.post('/api/settings/materials').send({ ...customMagnet, name: 'n42h' });
    expect(builtIn.status).toBe(409);
    expect(builtIn.body.error.message).toBe('name: "n42h" is a built-in magnet grade; choose another name');
    const strong = await engineer.post('/api/settings/materials').send({ ...customMagnet, name: 'Too strong', remanenceT: 2 });
    expect(strong.status).toBe(400);
    expect(strong.body.error.message).toBe('remanenceT: must be at most 1.6 T');
    const noKind = await engineer.post('/api/settings/materials').send({ ...customMagnet, kind: 'copper' });
    expect(noKind.body.error.message).toBe('kind: must be magnet or steel');

    const edited = await engineer.patch(`/api/settings/materials/${created.body.id}`).send({ pricePerKg: 52, version: 0 }).expect(200);
    expect(edited.body).toMatchObject({ pricePerKg: 52, remanenceT: 1.26, version: 1 });
    expect((await engineer.patch(`/api/settings/materials/${created.body.id}`).send({ pricePerKg: 53, version: 0 })).status).toBe(409);
    const wrongKind = await engineer.patch(`/api/settings/materials/${created.body.id}`).send({ thicknessM: 0.0005, version: 1 });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.error.message).toBe('body: is not a field of a magnet');
    const listed = await engineer.get('/api/settings').expect(200);
    expect(listed.body.materials.magnets.find((magnet: { id: number | null }) => magnet.id === created.body.id)).toMatchObject({ pricePerKg: 52, builtIn: false });

    const viewer = await signIn(context.app, await createUser(organization, 'viewer'));
    expect((await viewer.post('/api/settings/materials').send({ ...customMagnet, name: 'Viewer magnet' })).status).toBe(403);
    expect((await viewer.patch(`/api/settings/materials/${created.body.id}`).send({ pricePerKg: 1, version: 1 })).status).toBe(403);
    expect((await viewer.delete(`/api/settings/materials/${created.body.id}`)).status).toBe(403);

    const stranger = await signIn(context.app, await createUser(other, 'admin'));
    await stranger.patch(`/api/settings/materials/${created.body.id}`).send({ pricePerKg: 1, version: 1 }).expect(404);
    await stranger.delete(`/api/settings/materials/${created.body.id}`).expect(404);
    const theirs = (await stranger.get('/api/settings').expect(200)).body.materials.magnets;
    expect(theirs.some((magnet: { name: string }) => magnet.name === 'Plant N40 stock')).toBe(false);

    await engineer.delete(`/api/settings/materials/${created.body.id}?version=1`).expect(204);
    await engineer.delete(`/api/settings/materials/${created.body.id}`).expect(404);
  });
});
