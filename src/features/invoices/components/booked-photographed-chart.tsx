import { AxisBottom, AxisLeft } from '@visx/axis';
import { Group } from '@visx/group';
import { scaleBand, scaleLinear, scaleOrdinal } from '@visx/scale';
import { BarGroup } from '@visx/shape';

export interface ChartGroup {
  label: string;
  booked: number;
  photographed: number;
}

const keys = ['booked', 'photographed'] as const;
type Key = (typeof keys)[number];
// spruce-600 and clay-500 from tailwind.config.ts: SVG fills need the colour itself.
const colours: Record<Key, string> = { booked: '#1f4e5a', photographed: '#c46f28' };
const names: Record<Key, string> = { booked: 'Booked', photographed: 'Photographed' };

const width = 640;
const height = 260;
const margin = { top: 12, right: 12, bottom: 40, left: 40 };

/**
 * Booked against photographed per group (an office, or a day), as grouped bars drawn with
 * visx. The same numbers are in the table beside it for anyone not looking at the bars.
 */
export function BookedPhotographedChart({
  title,
  groups,
}: {
  title: string;
  groups: ChartGroup[];
}) {
  if (groups.length === 0) return null;
  const innerWidth = width - margin.left - margin.right;
  const innerHeight = height - margin.top - margin.bottom;
  const largest = Math.max(1, ...groups.flatMap((group) => [group.booked, group.photographed]));
  const x0 = scaleBand<string>({ domain: groups.map((group) => group.label), padding: 0.25 });
  x0.rangeRound([0, innerWidth]);
  const x1 = scaleBand<Key>({ domain: [...keys], padding: 0.1 });
  x1.rangeRound([0, x0.bandwidth()]);
  const y = scaleLinear<number>({ domain: [0, largest], nice: true, range: [innerHeight, 0] });
  const colour = scaleOrdinal<Key, string>({
    domain: [...keys],
    range: keys.map((k) => colours[k]),
  });
  const summary = groups
    .map((group) => `${group.label}: ${group.booked} booked, ${group.photographed} photographed`)
    .join('; ');
  return (
    <figure className="flex flex-col gap-2">
      <figcaption className="font-medium">{title}</figcaption>
      <ul className="flex gap-4 text-sm" aria-hidden>
        {keys.map((key) => (
          <li key={key} className="flex items-center gap-2">
            <span className="inline-block size-3 rounded-sm" style={{ background: colours[key] }} />
            {names[key]}
          </li>
        ))}
      </ul>
      <svg
        viewBox={`0 0 ${width} ${height}`}
        className="h-auto w-full max-w-2xl"
        role="img"
        aria-label={`${title}. ${summary}`}
        data-chart="booked-photographed"
      >
        <Group left={margin.left} top={margin.top}>
          <BarGroup
            data={groups}
            keys={[...keys]}
            height={innerHeight}
            x0={(group) => group.label}
            x0Scale={x0}
            x1Scale={x1}
            yScale={y}
            color={(key) => colour(key)}
          />
          <AxisLeft
            scale={y}
            numTicks={Math.min(5, largest)}
            tickFormat={(value) => String(value)}
          />
          <AxisBottom top={innerHeight} scale={x0} />
        </Group>
      </svg>
    </figure>
  );
}
