import type { SetupCard } from '../../../../server/schemas/setup-card';

/**
 * A top view of the set, drawn to scale from the card's distances. Directions are assumed
 * (key 45° to one side, fill 30° to the other, background and hair lights behind), since the
 * card records distances only.
 */
export function PlanSketch({ card }: { card: SetupCard }) {
  const { camera } = card;
  const angles: Record<string, number> = { key: 135, fill: -150, background: 20, hair: 60 };
  const points = [
    { label: 'Camera', x: -camera.cameraToSitterMetres, y: 0, kind: 'camera' },
    { label: 'Sitter', x: 0, y: 0, kind: 'sitter' },
    ...card.lights.map((light) => {
      const radians = ((angles[light.role] ?? 90) * Math.PI) / 180;
      return {
        label: `${light.role[0]?.toUpperCase()}${light.role.slice(1)}`,
        x: Math.cos(radians) * light.distanceMetres,
        y: Math.sin(radians) * light.distanceMetres,
        kind: 'light',
      };
    }),
  ];
  const wallX = camera.sitterToBackgroundMetres;
  const xs = [...points.map((p) => p.x), wallX];
  const ys = points.map((p) => p.y);
  const minX = Math.min(...xs) - 0.6;
  const maxX = Math.max(...xs) + 0.6;
  const minY = Math.min(...ys, -1) - 0.6;
  const maxY = Math.max(...ys, 1) + 0.6;
  const width = 480;
  const scale = width / (maxX - minX);
  const height = Math.max(160, (maxY - minY) * scale);
  const sx = (x: number) => (x - minX) * scale;
  const sy = (y: number) => (maxY - y) * scale;

  return (
    <svg
      viewBox={`0 0 ${width} ${height}`}
      role="img"
      aria-label="Plan sketch of the set, seen from above"
      className="w-full max-w-xl rounded-control border border-line bg-paper-raised"
    >
      <line
        x1={sx(wallX)}
        y1={8}
        x2={sx(wallX)}
        y2={height - 8}
        className="stroke-ink"
        strokeWidth={6}
      />
      <text x={sx(wallX) - 6} y={18} textAnchor="end" className="fill-ink-muted text-[11px]">
        Background ({camera.sitterToBackgroundMetres} m)
      </text>
      <line
        x1={sx(-camera.cameraToSitterMetres)}
        y1={sy(0)}
        x2={sx(0)}
        y2={sy(0)}
        className="stroke-line-strong"
        strokeDasharray="4 4"
      />
      {points.map((point) => (
        <g key={point.label}>
          {point.kind === 'light' ? (
            <line
              x1={sx(point.x)}
              y1={sy(point.y)}
              x2={sx(0)}
              y2={sy(0)}
              className="stroke-clay-500"
              strokeDasharray="2 4"
            />
          ) : null}
          {point.kind === 'sitter' ? (
            <circle cx={sx(point.x)} cy={sy(point.y)} r={12} className="fill-spruce-600" />
          ) : point.kind === 'camera' ? (
            <rect
              x={sx(point.x) - 12}
              y={sy(point.y) - 9}
              width={24}
              height={18}
              rx={3}
              className="fill-ink"
            />
          ) : (
            <circle cx={sx(point.x)} cy={sy(point.y)} r={9} className="fill-clay-500" />
          )}
          <text
            x={sx(point.x)}
            y={sy(point.y) + 26}
            textAnchor="middle"
            className="fill-ink text-[12px]"
          >
            {point.label}
          </text>
        </g>
      ))}
    </svg>
  );
}
