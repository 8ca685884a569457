import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import OutboxMessageView from 'components/OutboxMessageView.vue';
import type { OutboxMessageOutput } from 'shared/outbox';
import { createHarness, flushPromises, mountWithApp } from './mount';

afterEach(() => {
  document.body.innerHTML = '';
});

const message: OutboxMessageOutput = {
  id: 12,
  from: 'Statorline <no-reply@statorline.localhost>',
  to: ['nia.okafor@kestrel.example'],
  subject: 'You are invited',
  text: 'Accept: http://127.0.0.1:3000/invitation?token=abc123 (valid for 7 days).',
  html: '<p>Accept <a href="http://127.0.0.1:3000/invitation?token=abc123">here</a></p><script>parent.alert(1)</script>',
  headers: { 'message-id': '<1@statorline>' },
  attachments: [{ id: 3, filename: 'terms.pdf', contentType: 'application/pdf', sizeBytes: 2048 }],
  receivedAt: '2026-01-15T10:00:00.000Z',
};

describe('OutboxMessageView', () => {
  it('shows the HTML body in a fully sandboxed frame, its links apart, and the attachments as downloads', async () => {
    const wrapper = mountWithApp(OutboxMessageView, createHarness('admin'), {
      props: { message, attachmentUrl: (m: number, a: number) => `/api/outbox/${m}/attachments/${a}` },
    });
    await flushPromises();
    const frame = wrapper.get('[data-testid="outbox-message-html"]');
    expect(frame.attributes('sandbox')).toBe('');
    expect(frame.attributes('srcdoc')).toContain('<script>');
    expect(wrapper.get('[data-testid="outbox-message-link"]').attributes('href')).toBe('http://127.0.0.1:3000/invitation?token=abc123');
    const download = wrapper.get('[data-testid="outbox-attachment-3"]');
    expect(download.attributes('href')).toBe('/api/outbox/12/attachments/3');
    expect(download.text()).toContain('terms.pdf (2 kB)');
  });

  it('falls back to the plain text when there is no HTML body', async () => {
    const wrapper = mountWithApp(OutboxMessageView, createHarness('admin'), {
      props: { message: { ...message, html: null }, attachmentUrl: () => '' },
    });
    await flushPromises();
    expect(wrapper.find('iframe').exists()).toBe(false);
    expect(wrapper.get('[data-testid="outbox-message-text"]').text()).toContain('valid for 7 days');
  });
});
