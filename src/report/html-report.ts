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
table{border-collapse:collapse;margin:.5rem 0}td,th{border:1px solid #999;padding:.2rem .5rem;text-align:left;vertical-align:top}
td[align=right],th[align=right]{text-align:right;font-variant-numeric:tabular-nums}
h1{font-size:1.5rem}h2{font-size:1.2rem;margin-top:1.5rem}h3{font-size:1.05rem;margin:1rem 0 .3rem}figure{margin:1rem 0}
h2+table td:nth-child(3),h2+table td:nth-child(4){min-width:8rem}
@media print{body{max-width:none;margin:0;padding:0;font-size:10pt}h1{font-size:15pt}h2{font-size:12pt}h3{font-size:10.5pt}}
table,figure,svg,tr,li{break-inside:avoid}h1,h2,h3{break-after:avoid}`;

/** A CSS string literal for text people typed: quotes, backslashes and line ends escaped, no "<" to close the style. */
const cssString = (s: string) => `"${s.replace(/[\\"<>\n\r]/g, (c) => `\\${c.charCodeAt(0).toString(16)} `)}"`;

/**
 * Page margins that fit A4 and Letter alike (no page size is set), with the job on every page:
 * the work order and asset at the top, the page number at the bottom.
 */
function pageStyle(header: string): string {
  return `@page{margin:16mm 14mm 18mm;@top-left{content:${cssString(header)};font:9pt system-ui,sans-serif;color:#444}@bottom-right{content:"Page " counter(page) " of " counter(pages);font:9pt system-ui,sans-serif;color:#444}}`;
}

/** No script, no remote anything: the page's own style and the inline drawing only. */
export const CONTENT_SECURITY_POLICY = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; form-action 'none'; base-uri 'none'";

const escapeHtml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** Links a reader may follow: http and https only (no javascript:, data:, file:…). */

/**
 * `markdown` is the job report; `svg`, when given, replaces its chart link with the drawing itself;
 * `header` is what every printed page carries at its top (the work order and asset).
 */
export async function htmlReport(markdown: string, title: string, svg?: string, header = title): Promise<string> {
  const { Marked } = await import('marked');
  // The report itself links nothing and shows no image: a link or image is one made of typed text, kept as its words.
  const marked = new Marked({
    renderer: {
      html: ({ text }) => escapeHtml(text),
      link({ tokens }) {
        return this.parser.parseInline(tokens);
      },
      image: ({ text }) => escapeHtml(text),
    },
  });
  // A word no typed text can know stands where the drawing goes, in a paragraph of its own.
  const placeholder = `chart-${randomUUID()}`;
  const body = marked.parse(markdown.replace(/^!\[[^\]]*\]\([^)]*\)$/m, svg ? placeholder : ''), { async: false });
  const withChart = svg ? body.replace(`<p>${placeholder}</p>`, `<figure class="chart">${svg}</figure>`) : body;
  return `<!doctype html>\n<html lang="en"><head><meta charset="utf-8"><meta http-equiv="Content-Security-Policy" content="${CONTENT_SECURITY_POLICY}"><title>${escapeHtml(title)}</title><style>${STYLE}\n${pageStyle(header)}</style></head>\n<body>\n${withChart}</body></html>\n`;
}
