import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));
vi.setConfig({ testTimeout: 30_000 });

import RetrofitLogMeterPeriod from 'components/RetrofitLogMeterPeriod.vue';
import { meterRefusalFrom, previewMeterText, splitLine } from 'components/retrofit-log-meter';
import { stubXhr } from './fake-xhr';
import { createHarness, fakeFetch, flushPromises, mountWithApp } from './mount';
import { meterData } from './retrofit-log-fixtures';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const testid = (id: string) => `[data-testid="${id}"]`;

describe('previewMeterText', () => {
  it('reads the columns as the server does: separator from the header, unit from the value column, a third column as the variable', () => {
    const preview = previewMeterText('\ufefftimestamp;Power [kW];Production [t]\r\n2026-03-02 00:00;18,4;2,1\r\n\r\n2026-03-02 01:00;18,1;2,0\r\n');
    expect(preview.separator).toBe(';');
    expect(preview.header).toEqual(['timestamp', 'Power [kW]', 'Production [t]']);
    expect(preview.rows).toEqual([
      ['2026-03-02 00:00', '18,4', '2,1'],
      ['2026-03-02 01:00', '18,1', '2,0'],
    ]);
    expect(preview.dataRows).toBe(2);
    expect(preview.headerUnit).toBe('kW');
    expect(preview.variableName).toBe('Production [t]');
    expect(preview.problem).toBeNull();
    // "kWh" is found before "kW", as on the server.
    expect(previewMeterText('time,Energy (kWh)\n2026-03-02 00:00,4').headerUnit).toBe('kWh');
    expect(previewMeterText('time,value\n2026-03-02 00:00,4').headerUnit).toBeNull();
  });

  it('says when the header cannot be a meter file', () => {
    expect(previewMeterText('').problem).toBe('The file is empty.');
    expect(previewMeterText('time,kW,a,b\n1,2,3,4').problem).toContain('The header has 4 columns');
    expect(previewMeterText('just one column\n1').problem).toContain('The header has 1 column;');
  });

  it('keeps separators and quotes inside quoted fields', () => {
    expect(splitLine('"2026-03-02 00:00","1,5 kW","say ""hi"""', ',')).toEqual(['2026-03-02 00:00', '1,5 kW', 'say "hi"']);
  });

  it('takes the row errors of a refused upload from the error details', () => {
    expect(meterRefusalFrom({ rows: 3, errorCount: 2, errors: [{ row: 2, field: 'value', value: 'x', message: 'is not a number' }], gaps: [] })).toEqual({
      rows: 3,
      errorCount: 2,
      errors: [{ row: 2, field: 'value', value: 'x', message: 'is not a number' }],
      gaps: [],
    });
    expect(meterRefusalFrom({ field: 'file' })).toBeNull();
  });
});

describe('RetrofitLogMeterPeriod', () => {
  const mountPeriod = (props: Record<string, unknown> = {}) =>
    mountWithApp(RetrofitLogMeterPeriod, createHarness('engineer'), {
      props: { retrofitId: 12, period: 'baseline', stored: null, canUpload: true, blockedReason: null, ...props },
    });

  async function choose(wrapper: ReturnType<typeof mountPeriod>, text: string, name = 'meter.csv') {
    wrapper.findComponent({ name: 'QFile' }).vm.$emit('update:modelValue', new File([text], name, { type: 'text/csv' }));
    await flushPromises();
    await new Promise((resolve) => setTimeout(resolve, 0));
    await flushPromises();
  }

  it('previews a chosen file before it is sent, and asks for a unit the file does not name', async () => {
    fakeFetch({});
    const wrapper = mountPeriod();
    await choose(wrapper, 'timestamp,value\n2026-03-02 00:00,18.4\n2026-03-02 01:00,18.1');
    const preview = wrapper.get(testid('retrofit-meter-baseline-preview'));
    expect(preview.text()).toContain('2 readings; first 2 shown');
    expect(preview.findAll('tbody tr').map((row) => row.text())).toEqual(['2026-03-02 00:0018.4', '2026-03-02 01:0018.1']);
    expect(preview.text()).toContain('The header names no unit: choose kW or kWh');
    expect(wrapper.get(testid('retrofit-meter-baseline-upload')).attributes('disabled')).toBeDefined();

    wrapper.findAllComponents({ name: 'QSelect' })[0]!.vm.$emit('update:modelValue', 'kW');
    await flushPromises();
    expect(wrapper.get(testid('retrofit-meter-baseline-upload')).attributes('disabled')).toBeUndefined();
  });

  it('lists every problem of a refused file with its row, and sends the reading options with the file', async () => {
    fakeFetch({ 'GET /api/auth/csrf': { body: { token: 't' } } });
    const refusal = {
      error: {
        code: 'meter-data-invalid',
        message: '2 problems in the file (first: row 3, timestamp: duplicated timestamp (also on row 2)). Nothing was saved.',
        details: {
          rows: 3,
          errorCount: 2,
          // The server lists duplicates after the other checks; the table sorts by row.
          errors: [
            { row: 4, field: 'value', value: 'abc', message: 'is not a number' },
            { row: 3, field: 'timestamp', value: '2026-03-02 00:00', message: 'duplicated timestamp (also on row 2)' },
          ],
          gaps: [],
        },
      },
    };
    const sent = stubXhr(() => ({ status: 400, body: refusal }));
    const wrapper = mountPeriod();
    await choose(wrapper, 'timestamp;Power [kW]\n2026-03-02 00:00;1\n2026-03-02 00:00;2\n2026-03-02 01:00;abc');
    wrapper.findAllComponents({ name: 'QSelect' })[2]!.vm.$emit('update:modelValue', 'feeder');
    await flushPromises();
    await wrapper.get(testid('retrofit-meter-baseline-upload')).trigger('click');
    await vi.waitFor(() => expect(wrapper.find(testid('retrofit-meter-baseline-errors')).exists()).toBe(true));
    const errors = wrapper.get(testid('retrofit-meter-baseline-errors'));
    expect(errors.text()).toContain('Nothing was saved.');
    expect(errors.findAll('tbody tr').map((row) => row.findAll('td').map((cell) => cell.text()))).toEqual([
      ['3', 'timestamp', '2026-03-02 00:00', 'duplicated timestamp (also on row 2)'],
      ['4', 'value', 'abc', 'is not a number'],
    ]);
    const form = sent[0]!.form;
    expect(sent[0]!.url).toBe('/api/retrofits/12/meter-data');
    expect([form.get('period'), form.get('unit'), form.get('register'), form.get('scope')]).toEqual(['baseline', null, 'interval', 'feeder']);
  });

  it('shows what is stored: period, readings, energy, reading options and gaps', async () => {
    fakeFetch({});
    const wrapper = mountPeriod({ stored: meterData.baseline });
    const stored = wrapper.get(testid('retrofit-meter-baseline-stored')).text();
    expect(stored).toContain('pump-before.csv');
    expect(stored).toContain('2026-10-05 00:00 → 2026-10-19 00:00');
    expect(stored).toContain('336 every 60 min, 332 h covered');
    expect(stored).toContain('4,173 kWh');
    expect(stored).toContain('kW, per interval, this motor alone; variable “Production [t]”');
    expect(stored).toContain('1, left out (never filled)');
  });

  it('puts the reason in place of the upload when the period cannot take data', async () => {
    fakeFetch({});
    const wrapper = mountPeriod({ period: 'reporting', blockedReason: 'Reporting data follow the installation: record it first.' });
    expect(wrapper.text()).toContain('record it first');
    expect(wrapper.find(testid('retrofit-meter-reporting-file')).exists()).toBe(false);
  });
});
