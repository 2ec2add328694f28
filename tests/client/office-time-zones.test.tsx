import { cleanup, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { PreviewStep } from '../../src/features/roster/components/preview-step';
import { guessTimeZone } from '../../src/features/roster/components/office-time-zones';
import { renderWithProviders } from './render';
import { jsonResponse, sampleDraft } from './roster-fixtures';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Zone names are the IANA time zone database's, as the browser's Intl lists them.
describe("a new office's time zone, offered to be confirmed", () => {
  it('is the zone named after its city, else the one zone of the client’s offices, else none', () => {
    expect(guessTimeZone('Lisbon')).toBe('Europe/Lisbon');
    expect(guessTimeZone('Manchester', ['Europe/London', 'Europe/London'])).toBe('Europe/London');
    expect(guessTimeZone('Porto', ['Europe/London', 'Europe/Amsterdam'])).toBe('');
    expect(guessTimeZone('Porto')).toBe('');
  });

  it('comes filled in on the preview for an office the client does not have yet', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => jsonResponse(200, { rows: [], total: 0, page: 1, pageSize: 25 })),
    );
    const draft = {
      ...sampleDraft,
      newOffices: ['Manchester'],
      knownOffices: [
        { id: '00000000-0000-4000-8000-000000000009', name: 'Leeds', timeZone: 'Europe/London' },
      ],
    };
    renderWithProviders(
      <PreviewStep
        clientId="c1"
        draft={draft}
        onBack={() => undefined}
        onCommitted={() => undefined}
        onRechecked={() => undefined}
      />,
    );
    const select = await screen.findByLabelText('Time zone of Manchester');
    expect((select as HTMLSelectElement).value).toBe('Europe/London');
  });
});
