import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { ThroughputPlanner } from '../../src/features/days/components/throughput-planner';

// Figures are common practice (tests/reference/SOURCES.md): 60 / 7 = 8.57… per station-hour.
describe('throughput planner', () => {
  it('rounds the rates to one decimal', () => {
    render(<ThroughputPlanner headCount={100} stations={1} slotMinutes={7} hoursPerDay={8} />);
    const text = screen.getByRole('region', { name: 'Throughput planner' }).textContent ?? '';
    expect(text).toContain('seats 8.6 an hour');
    expect(text).toContain('plan on 5.7–7.1');
    expect(text).not.toMatch(/\d\.\d{2,}/);
  });
});
