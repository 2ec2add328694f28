export interface MailContent {
  heading: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  footnote?: string;
}

export function escapeHtml(text: string): string {
  return text
    .replaceAll('&', '&amp;')
    .replaceAll('<', '&lt;')
    .replaceAll('>', '&gt;')
    .replaceAll('"', '&quot;')
    .replaceAll("'", '&#39;');
}

/**
 * One layout for every message: a plain-text part and an HTML part with the same words. The
 * mailer adds the studio's sign-off, so no message is signed by the product.
 */
export function renderMail(content: MailContent): { text: string; html: string } {
  const textParts = [content.heading, '', ...content.paragraphs.flatMap((p) => [p, ''])];
  if (content.action) textParts.push(`${content.action.label}: ${content.action.url}`, '');
  if (content.footnote) textParts.push(content.footnote, '');

  const paragraphs = content.paragraphs
    .map((p) => `<p style="margin:0 0 14px;line-height:1.5">${escapeHtml(p)}</p>`)
    .join('');
  const action = content.action
    ? `<p style="margin:22px 0"><a href="${escapeHtml(content.action.url)}" style="background:#1f4e5a;color:#ffffff;padding:12px 20px;border-radius:8px;text-decoration:none;display:inline-block">${escapeHtml(content.action.label)}</a></p><p style="font-size:13px;color:#55606a">Or paste this address into your browser: ${escapeHtml(content.action.url)}</p>`
    : '';
  const footnote = content.footnote
    ? `<p style="font-size:13px;color:#55606a">${escapeHtml(content.footnote)}</p>`
    : '';
  const html = `<!doctype html><html><body style="font-family:'Work Sans',Arial,sans-serif;color:#1b2228;max-width:560px;margin:0 auto;padding:24px"><h1 style="font-size:20px;margin:0 0 16px">${escapeHtml(content.heading)}</h1>${paragraphs}${action}${footnote}</body></html>`;
  return { text: textParts.join('\n'), html };
}
