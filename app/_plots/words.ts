/** Joins clauses into sentences, each capitalised and ending with a full stop (plot summaries). */
export function sentences(parts: string[]): string {
  // only a Latin letter is capitalised: a sentence may open with a symbol (η0 must not become Η0, a capital eta)
  return parts.filter((p) => p.length > 0).map((p) => `${/^[a-z]/.test(p) ? p[0].toUpperCase() : p[0]}${p.slice(1)}${/[.!?]$/.test(p) ? '' : '.'}`).join(' ');
}
