import { cleanup, fireEvent, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { RosterDraft } from '../../server/schemas/roster';
import { RosterImportWizard } from '../../src/features/roster/components/roster-import-wizard';
import { renderWithProviders } from './render';
import { jsonResponse, sampleDraft } from './roster-fixtures';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Nobody missing: the save counts only the two to add.
const draft: RosterDraft = {
  ...sampleDraft,
  counts: { ...sampleDraft.counts, missing: 0 },
};

const json = (body: unknown) => jsonResponse(200, body);

function serve(open: RosterDraft | null) {
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string) =>
      url.endsWith('/roster/open-import')
        ? json({ draft: open })
        : json({ rows: [], total: 0, page: 1, pageSize: 25 }),
    ),
  );
}

describe('an import left open', () => {
  it('is offered on the upload step and taken up where its columns were', async () => {
    serve(draft);
    renderWithProviders(<RosterImportWizard clientId="c1" />);
    fireEvent.click(await screen.findByRole('button', { name: 'Continue with staff.csv' }));
    // The same columns as last time: straight to checking and confirming.
    expect(
      await screen.findByRole('button', { name: 'Save 2 changes to the roster' }),
    ).toBeTruthy();
    expect(screen.getByText('3. Check and confirm').getAttribute('aria-current')).toBe('step');
  });

  it('goes to the columns when they still need a choice, and says nothing when none is open', async () => {
    serve({ ...draft, mappingRemembered: false });
    renderWithProviders(<RosterImportWizard clientId="c1" />);
    fireEvent.click(await screen.findByRole('button', { name: 'Continue with staff.csv' }));
    expect((await screen.findByText('2. Match the columns')).getAttribute('aria-current')).toBe(
      'step',
    );
    cleanup();
    serve(null);
    renderWithProviders(<RosterImportWizard clientId="c1" />);
    await screen.findByText('Staff list (CSV file)');
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(screen.queryByRole('button', { name: /Continue with/ })).toBeNull();
  });
});
