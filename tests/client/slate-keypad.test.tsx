import { cleanup, fireEvent, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { Slate } from '../../src/features/station-console/components/slate';
import { renderWithProviders } from './render';

afterEach(() => cleanup());

const type = (digits: string) => {
  for (const digit of digits) fireEvent.click(screen.getByRole('button', { name: digit }));
};

function renderSlate(expectedFrame: number | null) {
  const onStart = vi.fn();
  renderWithProviders(
    <Slate
      name="Ines Carvalho"
      slateToken="KQ2ZL7MXR4TB6NVP3HWJ5DYC2A"
      flashSensitive={false}
      expectedFrame={expectedFrame}
      onStart={onStart}
      onCancel={() => undefined}
    />,
  );
  return onStart;
}

// The product's own keypad rules (issue: typing must replace the pre-filled number).
describe('the slate’s frame keypad', () => {
  it('replaces the pre-filled number with what is typed, instead of appending to it', () => {
    const onStart = renderSlate(451);
    type('0451');
    fireEvent.click(screen.getByRole('button', { name: 'Start sitting' }));
    expect(onStart).toHaveBeenCalledWith(451);
  });

  it('asks before starting at a number far from the expected one, then accepts it', () => {
    const onStart = renderSlate(451);
    type('4510');
    fireEvent.click(screen.getByRole('button', { name: 'Start sitting' }));
    expect(screen.getByRole('alert').textContent).toMatch(/4510 is far from the expected 0451/);
    expect(onStart).not.toHaveBeenCalled();
    fireEvent.click(screen.getByRole('button', { name: 'Yes, start at 4510' }));
    expect(onStart).toHaveBeenCalledWith(4510);
  });

  it('asks about a number below the expected one (a card change), but not about a rollover', () => {
    const onStart = renderSlate(9998);
    type('0003');
    fireEvent.click(screen.getByRole('button', { name: 'Start sitting' }));
    // 9998 → 9999 → 0001 (JEITA CP-3461 rollover): 0003 is just ahead, no question.
    expect(onStart).toHaveBeenCalledWith(3);
    cleanup();
    const again = renderSlate(700);
    type('0001');
    fireEvent.click(screen.getByRole('button', { name: 'Start sitting' }));
    expect(screen.getByRole('alert').textContent).toMatch(/Did the card change\?/);
    expect(again).not.toHaveBeenCalled();
  });
});
