import { Link } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { PortraitFiles } from '../../looks/components/portrait-files';
import { useMyProofDays } from '../api/sitter-proofs';

/** On the sitter's home page: their proofs, once the studio has sent them. */
export function MyProofsCard() {
  const { data } = useMyProofDays();
  if (!data || data.days.length === 0) return null;
  return (
    <Card title="Your portraits">
      <ul className="flex flex-col gap-2">
        {data.days.map((day) => (
          <li key={day.dayId}>
            <Link
              to={`/proofs/${day.dayId}`}
              className="inline-flex min-h-touch items-center rounded-control bg-spruce-600 px-4 font-medium text-paper-raised"
            >
              {day.open
                ? day.picked
                  ? `Change your choice (${day.clientName}, ${day.date})`
                  : `Choose your portrait (${day.clientName}, ${day.date})`
                : `See your portraits (${day.clientName}, ${day.date})`}
            </Link>
            <div className="mt-2">
              <PortraitFiles source={{ dayId: day.dayId }} />
            </div>
          </li>
        ))}
      </ul>
    </Card>
  );
}
