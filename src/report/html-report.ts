/**
 * The job report as one self-contained HTML page, with the characteristic drawn inline as SVG.
 * marked is loaded only here: it builds its patterns at import, which every other command would pay for.
 */
const STYLE = `body{font-family:system-ui,sans-serif;max-width:60rem;margin:2rem auto;padding:0 1rem;line-height:1.4}
table{border-collapse:collapse;margin:.5rem 0}td,th{border:1px solid #999;padding:.2rem .5rem;text-align:left}
h1{font-size:1.5rem}h2{font-size:1.2rem;margin-top:1.5rem}figure{margin:1rem 0}`;

const escapeHtml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/** `markdown` is the job report; `svg`, when given, replaces its chart link with the drawing itself. */
export async function htmlReport(markdown: string, title: string, svg?: string): Promise<string> {
  const { marked } = await import('marked');
  const body = marked.parse(markdown.replace(/^!\[[^\]]*\]\([^)]*\)$/m, svg ? '<figure class="chart"></figure>' : ''), { async: false });
  const withChart = svg ? body.replace('<figure class="chart"></figure>', `<figure class="chart">${svg}</figure>`) : body;
  return `<!doctype html>\n<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title><style>${STYLE}</style></head>\n<body>\n${withChart}</body></html>\n`;
}
