/** Words for stored codes, shared by server pages and client components. */
export const HEAT_SOURCE_LABELS: Record<string, string> = {
  'wood-fire': 'Wood fire',
  'propane-burner': 'Propane burner',
  'natural-gas': 'Natural gas',
  'solar-collector': 'Solar collector',
  electric: 'Electric',
  'heat-pump': 'Heat pump',
  other: 'Other',
};
