import { AxisBottom } from '@visx/axis';
import { Group } from '@visx/group';
import { scaleBand, scaleLinear, scaleOrdinal } from '@visx/scale';
import { BarGroupHorizontal } from '@visx/shape';
import type { ProgressGroup } from '../../../../server/schemas/days';

const keys = ['invited', 'booked', 'checkedIn', 'photographed', 'noShow'] as const;
type Key = (typeof keys)[number];
export const progressNames: Record<Key, string> = {
  invited: 'Invited',
  booked: 'Booked',
  checkedIn: 'Checked in',
  photographed: 'Photographed',
  noShow: 'No-show',
};
// Theme tokens from tailwind.config.ts (line-strong, spruce-500, spruce-700, clay-500,
// danger-600): SVG fills need the colour itself.
const colours: Record<Key, string> = {
  invited: '#b9b2a5',
  booked: '#2f6d79',
  checkedIn: '#173d47',
  photographed: '#c46f28',
  noShow: '#b3261e',
};

const width = 680;
const barHeight = 9;
const margin = { top: 8, right: 16, bottom: 32 };
// Labels are drawn in full ("Rotterdam · 2027-03-09"), never cut: the left margin fits the longest.
const characterWidth = 7;

/**
 * Invited, booked, checked in, photographed and no-show per group, as grouped horizontal bars
 * drawn with visx (plain SVG, so it prints and renders without a browser canvas). The numbers
 * are also in the table under it, for anyone not looking at the bars.
 */
export function ProgressChart({ title, groups }: { title: string; groups: ProgressGroup[] }) {
  if (groups.length === 0) return null;
  const left = Math.min(
    260,
    16 + characterWidth * Math.max(...groups.map((group) => group.label.length)),
  );
  const groupHeight = barHeight * keys.length + 14;
  const innerHeight = groupHeight * groups.length;
  const height = innerHeight + margin.top + margin.bottom;
  const innerWidth = width - left - margin.right;
  const largest = Math.max(1, ...groups.flatMap((group) => keys.map((key) => group[key])));
  const y0 = scaleBand<string>({
    domain: groups.map((group) => group.label),
    range: [0, innerHeight],
    padding: 0.15,
  });
  const y1 = scaleBand<Key>({ domain: [...keys], range: [0, y0.bandwidth()], padding: 0.1 });
  const x = scaleLinear<number>({ domain: [0, largest], nice: true, range: [0, innerWidth] });
  const colour = scaleOrdinal<Key, string>({
    domain: [...keys],
    range: keys.map((key) => colours[key]),
  });
  const summary = groups
    .map(
      (group) =>
        `${group.label}: ${keys.map((key) => `${group[key]} ${progressNames[key].toLowerCase()}`).join(', ')}`,
    )
    .join('; ');
  return (
    <figure className="flex flex-col gap-2 break-inside-avoid">
      <figcaption className="font-medium">{title}</figcaption>
      <ul className="flex flex-wrap gap-4 text-sm" aria-hidden>
        {keys.map((key) => (
          <li key={key} className="flex items-center gap-2">
            <span className="inline-block size-3 rounded-sm" style={{ background: colours[key] }} />
            {progressNames[key]}
          </li>
        ))}
      </ul>
      <svg
        viewBox={`0 0 ${width} ${height}`}
        className="h-auto w-full max-w-3xl"
        role="img"
        aria-label={`${title}. ${summary}`}
        data-chart="progress"
      >
        <Group left={left} top={margin.top}>
          <BarGroupHorizontal
            data={groups}
            keys={[...keys]}
            width={innerWidth}
            y0={(group) => group.label}
            y0Scale={y0}
            y1Scale={y1}
            xScale={x}
            color={(key) => colour(key)}
          />
          {groups.map((group) => (
            <text
              key={group.label}
              x={-8}
              y={(y0(group.label) ?? 0) + y0.bandwidth() / 2}
              textAnchor="end"
              dominantBaseline="middle"
              fontSize={12}
              fill="#1b2228"
            >
              {group.label}
            </text>
          ))}
          <AxisBottom
            top={innerHeight}
            scale={x}
            numTicks={Math.min(5, largest)}
            tickFormat={(value) => String(value)}
          />
        </Group>
      </svg>
      <table className="w-full max-w-3xl text-left text-sm tabular-nums">
        <caption className="sr-only">{title}: the numbers</caption>
        <thead>
          <tr className="border-b border-line">
            <th scope="col" className="py-1 pr-3 font-medium">
              {title.replace(/^By /, '').replace(/^./, (first) => first.toUpperCase())}
            </th>
            {keys.map((key) => (
              <th key={key} scope="col" className="py-1 pr-3 font-medium">
                {progressNames[key]}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {groups.map((group) => (
            <tr key={group.label} className="border-b border-line">
              <th scope="row" className="py-1 pr-3 font-normal">
                {group.label}
              </th>
              {keys.map((key) => (
                <td key={key} className="py-1 pr-3">
                  {group[key]}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}
