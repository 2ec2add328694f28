import { useParams } from 'react-router-dom';
import { PortraitFiles } from '../../../features/looks/components/portrait-files';
import { PublicFrame } from '../public-frame';

/** A sitter's personal download link, from the "portraits are ready" e-mail. */
export function PortraitsLinkPage() {
  const { token = '' } = useParams();
  return (
    <PublicFrame title="Your finished portraits">
      <PortraitFiles source={{ token }} />
    </PublicFrame>
  );
}
