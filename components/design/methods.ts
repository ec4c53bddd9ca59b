import type { MethodName } from '../../schemas/discretize';

/** On-screen names of the discretization methods (the trade's terms). */
export const METHOD_LABELS: Record<MethodName, string> = {
  tustin: 'Tustin',
  prewarp: 'Prewarped Tustin',
  matched: 'Matched pole–zero',
  zoh: 'Zero-order hold',
  'backward-euler': 'Backward Euler',
};

/** Short column heads for narrow tables. */
export const METHOD_SHORT: Record<MethodName, string> = {
  tustin: 'Tustin',
  prewarp: 'Prewarped',
  matched: 'Matched',
  zoh: 'ZOH',
  'backward-euler': 'Bwd Euler',
};
