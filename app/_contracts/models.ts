/** The fit models offered on the fit page and named in reports (built-in names of analysis/fit), for both sides. */
export const MODEL_CHOICES = [
  { id: 'coil', label: 'Constant-source coil (ε–NTU)' },
  { id: 'exp-inlet', label: 'Exponential toward the inlet' },
  { id: 'exp-approach', label: 'Exponential approach' },
  { id: 'poly2', label: 'Quadratic' },
  { id: 'poly3', label: 'Cubic' },
  { id: 'power', label: 'Power law' },
] as const;

/** A model's name for people (its id when it is a custom expression). */
export const modelLabel = (id: string) => MODEL_CHOICES.find((m) => m.id === id)?.label ?? id;
