import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { PreviewRow } from '../../server/schemas/roster';
import { PreviewTable } from '../../src/features/roster/components/preview-table';
import { renderWithProviders } from './render';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const row: PreviewRow = {
  position: 0,
  rowNumber: 2,
  kind: 'add',
  personId: null,
  values: {
    givenName: 'Ines',
    familyName: 'Carvalho',
    preferredName: null,
    email: 'ines.carvalho@hp.example',
    employeeId: 'HP-001',
    department: null,
    jobTitle: null,
    office: 'Porto',
    extras: {},
    active: true,
  },
  before: null,
  changedFields: [],
  errors: {},
  warnings: {},
};

describe('the preview table', () => {
  it('sorts on the server when a heading is pressed: row, what happens, name, e-mail', async () => {
    const urls: string[] = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string) => {
        urls.push(url);
        return new Response(JSON.stringify({ rows: [row], total: 1, page: 1, pageSize: 25 }), {
          status: 200,
          headers: { 'Content-Type': 'application/json' },
        });
      }),
    );
    renderWithProviders(<PreviewTable clientId="c1" draftId="d1" kind="all" />);
    await screen.findByText('ines.carvalho@hp.example');
    for (const heading of ['Row', 'What happens', 'Name', 'E-mail']) {
      expect(screen.getByRole('button', { name: new RegExp(`^${heading}`) })).toBeTruthy();
    }
    expect(screen.queryByRole('button', { name: /^Details/ })).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: /^Name/ }));
    await waitFor(() => expect(urls.some((url) => url.includes('sort=name'))).toBe(true));
    const sorted = new URL(urls.find((url) => url.includes('sort=name')) ?? '', 'http://x');
    expect(sorted.searchParams.get('direction')).toBe('asc');
    expect(sorted.searchParams.get('page')).toBe('1');
    // A number column's first press sorts ascending too (row 1 first), like the text ones.
    // (The first load asks for sort=position already: look only at what the press sends.)
    const before = urls.length;
    fireEvent.click(screen.getByRole('button', { name: /^Row/ }));
    const pressed = () => urls.slice(before).find((url) => url.includes('sort=position'));
    await waitFor(() => expect(pressed()).toBeTruthy());
    expect(new URL(pressed() ?? '', 'http://x').searchParams.get('direction')).toBe('asc');
  });
});
