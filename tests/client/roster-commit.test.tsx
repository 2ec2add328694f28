import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { ImportSummary, RosterDraft } from '../../server/schemas/roster';
import { PreviewStep } from '../../src/features/roster/components/preview-step';
import { renderWithProviders } from './render';
import { jsonResponse, sampleDraft } from './roster-fixtures';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const draft = sampleDraft;

const summary: ImportSummary = {
  id: '00000000-0000-4000-8000-000000000002',
  fileName: 'staff.csv',
  importedAt: '2026-12-02T10:00:00.000Z',
  importedBy: 'Casey Ward',
  added: 2,
  updated: 0,
  unchanged: 0,
  deactivated: 0,
  skipped: 0,
  officesCreated: 0,
};

const json = jsonResponse;

describe('saving a roster import (issue 14, item 2)', () => {
  it('says the import is being saved while another request saves it, then shows its result', async () => {
    const commits: unknown[] = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init?: RequestInit) => {
        if (!url.endsWith('/commit'))
          return json(200, { rows: [], total: 0, page: 1, pageSize: 25 });
        commits.push(JSON.parse(String(init?.body)));
        return commits.length === 1
          ? json(409, {
              error: {
                code: 'import_being_saved',
                message: 'This import is being saved. Its result appears here when it is done.',
              },
            })
          : json(200, summary);
      }),
    );
    const onCommitted = vi.fn();
    renderWithProviders(
      <PreviewStep
        clientId="c1"
        draft={draft}
        onBack={() => undefined}
        onCommitted={onCommitted}
        onRechecked={() => undefined}
      />,
    );
    fireEvent.click(screen.getByRole('button', { name: 'Save 2 changes to the roster' }));
    expect(
      await screen.findByText(
        'This import is being saved. Its result appears here when it is done.',
      ),
    ).toBeTruthy();
    await waitFor(() => expect(onCommitted).toHaveBeenCalled(), { timeout: 4000 });
    expect(onCommitted.mock.calls[0]?.[0]).toEqual(summary);
    // Nobody not in the file is deactivated unless asked (issue 13, item 10).
    expect(commits[0]).toEqual({
      officeTimeZones: {},
      deactivateMissing: false,
      rekeyConflicts: false,
    });
    expect(commits).toHaveLength(2);
  });

  it('after the roster changed, checks the same file and columns again and hands on the new preview', async () => {
    const requests: { url: string; method: string; body: unknown }[] = [];
    const rechecked: RosterDraft = { ...draft, counts: { ...draft.counts, add: 1, update: 1 } };
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init?: RequestInit) => {
        const method = init?.method ?? 'GET';
        requests.push({ url, method, body: init?.body ? JSON.parse(String(init.body)) : null });
        if (url.endsWith('/commit'))
          return json(409, {
            error: {
              code: 'roster_changed',
              message: 'The roster changed since this preview. Check the rows again, then confirm.',
            },
          });
        if (url.endsWith('/mapping')) return json(200, rechecked);
        return json(200, { rows: [], total: 0, page: 1, pageSize: 25 });
      }),
    );
    const onRechecked = vi.fn();
    renderWithProviders(
      <PreviewStep
        clientId="c1"
        draft={draft}
        onBack={() => undefined}
        onCommitted={() => undefined}
        onRechecked={onRechecked}
      />,
    );
    fireEvent.click(screen.getByRole('button', { name: 'Save 2 changes to the roster' }));
    fireEvent.click(await screen.findByRole('button', { name: 'Check the rows again' }));
    await waitFor(() => expect(onRechecked).toHaveBeenCalled());
    expect(onRechecked.mock.calls[0]?.[0]).toEqual(rechecked);
    const remap = requests.find((request) => request.url.endsWith('/mapping'));
    expect(remap).toMatchObject({
      url: `/api/clients/c1/roster/imports/${draft.id}/mapping`,
      method: 'PUT',
      body: { mapping: draft.mapping },
    });
  });

  it('words one change and one row in error in the singular', () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => json(200, { rows: [], total: 0, page: 1, pageSize: 25 })),
    );
    renderWithProviders(
      <PreviewStep
        clientId="c1"
        draft={{ ...draft, counts: { ...draft.counts, add: 1, error: 1 } }}
        onBack={() => undefined}
        onCommitted={() => undefined}
        onRechecked={() => undefined}
      />,
    );
    expect(screen.getByRole('button', { name: 'Save 1 change to the roster' })).toBeTruthy();
    expect(screen.getByText(/^1 row has problems and will be left out\./)).toBeTruthy();
  });
});
