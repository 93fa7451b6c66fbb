/** Joins clauses into sentences, each capitalised and ending with a full stop (plot summaries). */
export function sentences(parts: string[]): string {
  return parts.filter((p) => p.length > 0).map((p) => `${p[0].toUpperCase()}${p.slice(1)}${/[.!?]$/.test(p) ? '' : '.'}`).join(' ');
}
