import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { CorrectFrames } from '../../src/features/station-console/components/correct-frames';
import { FinishSitting } from '../../src/features/station-console/components/finish-sitting';
import type { ShownSitting } from '../../src/features/station-console/model/apply-pending';
import { renderWithProviders } from './render';

// The product's own rules (issue: a mistyped first frame must not block the station).

afterEach(() => cleanup());

const type = (group: string, digits: string) => {
  const keypad = within(screen.getByRole('group', { name: group }));
  for (const digit of digits) fireEvent.click(keypad.getByRole('button', { name: digit }));
};
const shownFrame = (group: string) =>
  within(screen.getByRole('group', { name: group })).getByRole('status').textContent;
const click = (name: string | RegExp) => fireEvent.click(screen.getByRole('button', { name }));

function renderFinish(refusedLastFrame?: number) {
  const onFinish = vi.fn();
  const onCorrectFirstAndFinish = vi.fn();
  renderWithProviders(
    <FinishSitting
      name="Ines Carvalho"
      firstFrame={4510}
      typedFirstFrame={4510}
      refusedLastFrame={refusedLastFrame}
      onFinish={onFinish}
      onCorrectFirstAndFinish={onCorrectFirstAndFinish}
      onCancel={() => undefined}
    />,
  );
  return { onFinish, onCorrectFirstAndFinish };
}

const sitting = (overrides: Partial<ShownSitting> = {}): ShownSitting => ({
  id: 's1',
  personId: 'p1',
  stationId: 'station',
  checkInId: 'c1',
  slateToken: 'KQ2ZL7MXR4TB6NVP3HWJ5DYC2A',
  firstFrame: 451,
  lastFrame: 466,
  typedFirstFrame: 451,
  typedLastFrame: 466,
  framesCorrectedAt: null,
  startedAt: '2030-03-14T09:00:00.000Z',
  finishedAt: '2030-03-14T09:05:00.000Z',
  waiting: false,
  ...overrides,
});

describe('finishing after a mistyped first frame', () => {
  it('refuses a last frame that cannot follow, and corrects the first frame to finish', () => {
    const { onFinish, onCorrectFirstAndFinish } = renderFinish();
    expect(screen.queryByRole('button', { name: /correct it/ })).toBeNull();
    type('Last frame number', '466');
    click('Finish with last frame');
    expect(screen.getByRole('alert').textContent).toMatch(
      /The last frame 0466 does not follow the first, 4510/,
    );
    expect(onFinish).not.toHaveBeenCalled();

    click('First frame was typed as 4510 — correct it');
    expect(shownFrame('Corrected first frame')).toBe('4510');
    // Still too far from 0466: the same refusal, nothing recorded.
    type('Corrected first frame', '7000');
    click('Correct and finish');
    expect(screen.getByRole('alert').textContent).toMatch(/does not follow the first, 7000/);
    fireEvent.click(screen.getByRole('button', { name: 'Clear' }));
    type('Corrected first frame', '451');
    click('Correct and finish');
    expect(onCorrectFirstAndFinish).toHaveBeenCalledWith(451, 466);
    expect(onFinish).not.toHaveBeenCalled();
  });

  it('opens on a refusal from the server with the fix already offered', () => {
    renderFinish(466);
    expect(shownFrame('Last frame number')).toBe('0466');
    expect(screen.getByRole('alert').textContent).toMatch(/0466 does not follow/);
    screen.getByRole('button', { name: 'First frame was typed as 4510 — correct it' });
  });

  it('finishes at once when the last frame follows', () => {
    const { onFinish } = renderFinish();
    type('Last frame number', '4522');
    click('Finish with last frame');
    expect(onFinish).toHaveBeenCalledWith(4522);
  });
});

describe('correcting the frame numbers of a sitting', () => {
  it('corrects the last frame of a finished sitting, replacing the number shown', () => {
    const onSave = vi.fn();
    renderWithProviders(
      <CorrectFrames name="Ines" sitting={sitting()} onSave={onSave} onCancel={() => {}} />,
    );
    click('Last frame 0466');
    expect(shownFrame('Corrected last frame')).toBe('0466');
    type('Corrected last frame', '0468');
    click('Save correction');
    expect(onSave).toHaveBeenCalledWith({ lastFrame: 468 });
  });

  it('offers only the first frame while the sitting is open, and refuses an unchanged number', () => {
    const onSave = vi.fn();
    renderWithProviders(
      <CorrectFrames
        name="Ines"
        sitting={sitting({ finishedAt: null, lastFrame: null, typedLastFrame: null })}
        onSave={onSave}
        onCancel={() => {}}
      />,
    );
    expect(screen.queryByRole('button', { name: /Last frame/ })).toBeNull();
    click('Save correction');
    expect(screen.getByRole('alert').textContent).toBe('This is the number already recorded.');
    type('Corrected first frame', '452');
    click('Save correction');
    expect(onSave).toHaveBeenCalledWith({ firstFrame: 452 });
  });
});
