import { Fragment } from 'react';

const urlPattern = /(https?:\/\/[^\s<>"]+)/g;

/** Plain text with its web addresses turned into links. */
export function LinkifiedText({ text }: { text: string }) {
  const parts = text.split(urlPattern);
  return (
    <pre className="whitespace-pre-wrap break-words font-sans text-sm">
      {parts.map((part, index) =>
        index % 2 === 1 ? (
          <a key={index} href={part} className="text-spruce-700 underline">
            {part}
          </a>
        ) : (
          <Fragment key={index}>{part}</Fragment>
        ),
      )}
    </pre>
  );
}
