import { useState } from 'react';
import type { CaughtMailMessage } from '../../../../server/schemas/mailbox';
import { attachmentUrl } from '../api/get-message';
import { LinkifiedText } from './linkified-text';

const kilobytes = (bytes: number) => `${Math.max(1, Math.round(bytes / 1024))} KB`;

/**
 * The HTML part is shown in a sandboxed frame: no scripts, no access to the app; links open in
 * a new tab. Inline images arrive inside the HTML already (the catcher resolves cid: links).
 */
function htmlDocument(html: string): string {
  const base = '<base target="_blank">';
  return /<head[^>]*>/i.test(html)
    ? html.replace(/<head([^>]*)>/i, `<head$1>${base}`)
    : `${base}${html}`;
}

export function MailView({ message }: { message: CaughtMailMessage }) {
  const [part, setPart] = useState<'html' | 'text'>(message.html ? 'html' : 'text');
  return (
    <div className="flex flex-col gap-3">
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-sm">
        <dt className="text-ink-muted">From</dt>
        <dd>{message.from}</dd>
        <dt className="text-ink-muted">Reply to</dt>
        <dd>{message.replyTo || '(not set)'}</dd>
        <dt className="text-ink-muted">To</dt>
        <dd>{message.to.join(', ')}</dd>
      </dl>
      <div role="group" aria-label="Part shown" className="flex gap-2">
        {(['html', 'text'] as const).map((kind) => (
          <button
            key={kind}
            type="button"
            aria-pressed={part === kind}
            disabled={kind === 'html' && !message.html}
            onClick={() => setPart(kind)}
            className={`min-h-touch rounded-control border px-3 ${
              part === kind ? 'border-spruce-500 bg-spruce-50' : 'border-line bg-paper-raised'
            }`}
          >
            {kind === 'html' ? 'Formatted (HTML)' : 'Plain text'}
          </button>
        ))}
      </div>
      {part === 'html' && message.html ? (
        <iframe
          title="Formatted message"
          sandbox="allow-popups allow-popups-to-escape-sandbox"
          srcDoc={htmlDocument(message.html)}
          className="h-[32rem] w-full rounded-control border border-line bg-white"
        />
      ) : (
        <LinkifiedText text={message.text} />
      )}
      {message.attachments.length > 0 ? (
        <section aria-label="Attachments">
          <h3 className="mb-2 font-medium">Attachments</h3>
          <ul className="flex flex-col gap-2">
            {message.attachments.map((attachment) => {
              const url = attachmentUrl(message.id, attachment.index);
              const name = attachment.filename || `attachment-${attachment.index + 1}`;
              return (
                <li key={attachment.index} className="flex items-center gap-3">
                  {attachment.contentType.startsWith('image/') ? (
                    <img
                      src={url}
                      alt={`Preview of ${name}`}
                      className="h-16 w-16 object-contain"
                    />
                  ) : null}
                  <a href={url} download={name} className="text-spruce-700 underline">
                    {name}
                  </a>
                  <span className="text-sm text-ink-muted">
                    {attachment.contentType} · {kilobytes(attachment.bytes)}
                  </span>
                </li>
              );
            })}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
