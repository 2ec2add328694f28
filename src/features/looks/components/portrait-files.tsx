import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

interface Files {
  files: Array<{ id: string; fileName: string; renditionName: string; byteSize: number }>;
}

const size = (bytes: number) =>
  `${Math.max(1, Math.round(bytes / 1000)).toLocaleString('en-GB')} kB`;

/** A sitter's finished files: through their personal link, or signed in. */
export function PortraitFiles({ source }: { source: { token: string } | { dayId: string } }) {
  const base = 'token' in source ? `/portraits/${source.token}` : `/my-portraits/${source.dayId}`;
  const { data, error } = useQuery({
    queryKey: ['portrait-files', base],
    queryFn: () => api<Files>(base),
  });
  if (error) return <p role="alert">{error.message}</p>;
  if (!data || data.files.length === 0) return null;
  return (
    <ul className="flex flex-col gap-2" aria-label="Your finished portraits">
      {data.files.map((file) => (
        <li key={file.id}>
          <a
            className="inline-flex min-h-touch items-center rounded-control bg-spruce-600 px-4 font-medium text-paper-raised"
            href={`/api${base}/files/${file.id}`}
            download
          >
            {file.renditionName} · {file.fileName} ({size(file.byteSize)})
          </a>
        </li>
      ))}
    </ul>
  );
}
