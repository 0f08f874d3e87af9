/**
 * The job report as one self-contained HTML page, with the characteristic drawn inline as SVG.
 * marked is loaded only here: it builds its patterns at import, which every other command would pay for.
 *
 * The page loads nothing and runs nothing: raw HTML in the Markdown is shown as text, a link
 * whose scheme is not http or https is shown as its text alone, images are not loaded (the one
 * drawing is inline), and a Content-Security-Policy forbids scripts and every remote resource.
 */
import { randomUUID } from 'node:crypto';

const STYLE = `body{font-family:system-ui,sans-serif;max-width:60rem;margin:2rem auto;padding:0 1rem;line-height:1.4}
table{border-collapse:collapse;margin:.5rem 0}td,th{border:1px solid #999;padding:.2rem .5rem;text-align:left}
h1{font-size:1.5rem}h2{font-size:1.2rem;margin-top:1.5rem}figure{margin:1rem 0}`;

/** No script, no remote anything: the page's own style and the inline drawing only. */
export const CONTENT_SECURITY_POLICY = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; form-action 'none'; base-uri 'none'";

const escapeHtml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** Links a reader may follow: http and https only (no javascript:, data:, file:…). */
const followable = (href: string) => /^https?:\/\//i.test(href.trim());

/** `markdown` is the job report; `svg`, when given, replaces its chart link with the drawing itself. */
export async function htmlReport(markdown: string, title: string, svg?: string): Promise<string> {
  const { Marked } = await import('marked');
  const marked = new Marked({
    renderer: {
      html: ({ text }) => escapeHtml(text),
      link({ href, tokens }) {
        const text = this.parser.parseInline(tokens);
        return followable(href) ? `<a href="${escapeHtml(href)}" rel="noreferrer noopener">${text}</a>` : text;
      },
      image: ({ text }) => escapeHtml(text),
    },
  });
  // A word no typed text can know stands where the drawing goes, in a paragraph of its own.
  const placeholder = `chart-${randomUUID()}`;
  const body = marked.parse(markdown.replace(/^!\[[^\]]*\]\([^)]*\)$/m, svg ? placeholder : ''), { async: false });
  const withChart = svg ? body.replace(`<p>${placeholder}</p>`, `<figure class="chart">${svg}</figure>`) : body;
  return `<!doctype html>\n<html lang="en"><head><meta charset="utf-8"><meta http-equiv="Content-Security-Policy" content="${CONTENT_SECURITY_POLICY}"><title>${escapeHtml(title)}</title><style>${STYLE}</style></head>\n<body>\n${withChart}</body></html>\n`;
}
