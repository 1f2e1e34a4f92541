import type { MailDocument, MailSection } from './document';
import { LEVEL_COLOUR, LEVEL_SHAPE } from './levels';

/** LOOK.md's palette; fonts fall back to what the reader has, nothing is fetched. */
const PAPER = '#f6f4ef';
const SURFACE = '#fffdf8';
const HAIRLINE = '#e3ded3';
const INK = '#1e2326';
const INK_2 = '#5b6368';
const TEAL = '#0d5c63';
const BRASS = '#a8741a';
const SANS = "'IBM Plex Sans', 'Segoe UI', Helvetica, Arial, sans-serif";
const MONO = "'JetBrains Mono', Menlo, Consolas, 'Liberation Mono', monospace";

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] as string);
}

/** Text with its http(s) addresses made into links (the address stays visible). */
function linked(text: string): string {
  return escapeHtml(text).replace(/https?:\/\/[^\s<]+[^\s<.,;:)]/g, (url) => `<a href="${url}" style="color:${TEAL}">${url}</a>`);
}

function badge(doc: MailDocument): string {
  if (!doc.level || !doc.badgeText) return '';
  const c = LEVEL_COLOUR[doc.level];
  const border = doc.level === 'stale' ? 'dashed' : 'solid';
  return `<span style="display:inline-block;padding:2px 10px;border-radius:10px;background:${c.fill};color:${c.ink};border:1px ${border} ${c.border};font-family:${MONO};font-size:13px;vertical-align:middle">${LEVEL_SHAPE[doc.level]} ${escapeHtml(doc.badgeText)}</span>`;
}

function section(s: MailSection): string {
  const parts = [`<h2 style="margin:24px 0 8px;font-size:13px;letter-spacing:0.06em;text-transform:uppercase;color:${INK_2}">${escapeHtml(s.title)}</h2>`];
  if (s.rows?.length) {
    const rows = s.rows
      .map((r) => `<tr><td style="padding:6px 16px 6px 0;color:${INK_2};white-space:nowrap;vertical-align:top">${escapeHtml(r.label)}</td><td style="padding:6px 0;${r.figure ? `font-family:${MONO};` : ''}">${linked(r.value)}</td></tr>`)
      .join('');
    parts.push(`<table role="presentation" style="border-collapse:collapse;font-size:14px">${rows}</table>`);
  }
  if (s.table) {
    const { head, rows, figureColumns } = s.table;
    const cell = (text: string, c: number, tag: 'td' | 'th') => {
      const figure = figureColumns.includes(c);
      return `<${tag} style="padding:6px 10px;border-bottom:1px solid ${HAIRLINE};text-align:${figure ? 'right' : 'left'};${figure && tag === 'td' ? `font-family:${MONO};` : ''}${tag === 'th' ? `color:${INK_2};font-weight:600;` : ''}">${escapeHtml(text)}</${tag}>`;
    };
    parts.push(
      `<table style="border-collapse:collapse;font-size:13px;width:100%"><tr>${head.map((h, c) => cell(h, c, 'th')).join('')}</tr>${rows
        .map((r) => `<tr>${r.map((v, c) => cell(v, c, 'td')).join('')}</tr>`)
        .join('')}</table>`,
    );
  }
  for (const p of s.paragraphs ?? []) parts.push(`<p style="margin:8px 0;line-height:1.5">${linked(p)}</p>`);
  if (s.code) parts.push(`<pre style="margin:8px 0;padding:10px 12px;background:${PAPER};border:1px solid ${HAIRLINE};font-family:${MONO};font-size:12px;white-space:pre-wrap">${escapeHtml(s.code)}</pre>`);
  return parts.join('\n');
}

/** The HTML part: one card on warm paper, the brim line under the product name. */
export function renderHtml(doc: MailDocument): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(doc.heading)}</title></head>
<body style="margin:0;padding:24px;background:${PAPER};color:${INK};font-family:${SANS};font-size:15px">
<div style="max-width:640px;margin:0 auto;background:${SURFACE};border:1px solid ${HAIRLINE};border-radius:6px;padding:24px 28px">
<div style="font-weight:600;color:${TEAL};letter-spacing:0.04em;padding-bottom:6px;border-bottom:2px solid ${BRASS};margin-bottom:18px">Brimwatch</div>
<h1 style="font-size:20px;margin:0 0 12px;line-height:1.35">${badge(doc)} ${escapeHtml(doc.heading)}</h1>
${doc.intro.map((p) => `<p style="margin:8px 0;line-height:1.5">${linked(p)}</p>`).join('\n')}
${doc.sections.map(section).join('\n')}
<p style="margin:28px 0 0;padding-top:12px;border-top:1px solid ${HAIRLINE};color:${INK_2};font-size:12px;line-height:1.5">Caution: ${escapeHtml(doc.caution)}</p>
</div>
</body></html>
`;
}
