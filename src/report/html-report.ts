/**
 * The job report as one self-contained HTML page, with the characteristic drawn inline as SVG.
 * marked is loaded only here: it builds its patterns at import, which every other command would pay for.
 */
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

const escapeHtml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/**
 * `markdown` is the job report; `svg`, when given, replaces its chart link with the drawing itself;
 * `header` is what every printed page carries at its top (the work order and asset).
 */
export async function htmlReport(markdown: string, title: string, svg?: string, header = title): Promise<string> {
  const { marked } = await import('marked');
  const body = marked.parse(markdown.replace(/^!\[[^\]]*\]\([^)]*\)$/m, svg ? '<figure class="chart"></figure>' : ''), { async: false });
  // The report itself links nothing: any link is one marked made of typed text (a URL in a note).
  const unlinked = body.replace(/<a\b[^>]*>|<\/a>/g, '');
  const withChart = svg ? unlinked.replace('<figure class="chart"></figure>', `<figure class="chart">${svg}</figure>`) : unlinked;
  return `<!doctype html>\n<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title><style>${STYLE}\n${pageStyle(header)}</style></head>\n<body>\n${withChart}</body></html>\n`;
}
