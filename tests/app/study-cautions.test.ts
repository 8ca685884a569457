import { describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import StudyCautions from 'components/StudyCautions.vue';
import { createHarness, mountWithApp } from './mount';

describe('StudyCautions', () => {
  it('reads as separate sentences when the drive and magnet cautions are both shown', () => {
    const wrapper = mountWithApp(StudyCautions, createHarness('engineer'), { props: { drive: true, bldc: true } });
    // HTML collapses runs of spaces; what matters is that a space separates the sentences.
    const text = wrapper.text().replace(/\s+/g, ' ');
    expect(text).toContain('licensed electrician or engineer. A drive changes');
    expect(text).toContain('of the supply. A permanent-magnet rotor');
  });

  it('leaves the magnet caution out where no permanent-magnet option is shown', () => {
    const wrapper = mountWithApp(StudyCautions, createHarness('engineer'), { props: { drive: false, bldc: false } });
    expect(wrapper.text()).not.toContain('permanent-magnet');
    expect(wrapper.text()).not.toContain('A drive changes');
  });
});
