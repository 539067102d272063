/** The estimate as a file: the inputs in words and as sent, and the full unrounded result (JSON). */
import type { Estimate } from './EstimateResults';

export function estimateDocument(inputs: [string, string][], request: unknown, result: Estimate, now = new Date()) {
  return {
    kind: 'swardkeep-estimate',
    computedAt: now.toISOString(),
    method: 'IPCC Tier 1 stock-change method (2006 Guidelines, Vol 4, Eq 2.25)',
    inputs: Object.fromEntries(inputs),
    request,
    result,
    caution:
      'Tier 1 estimates use international default values and are uncertain by tens of percent. They support, and ' +
      'never replace, site survey, soil sampling, local law and the judgement of licensed professionals.',
  };
}

export function downloadEstimate(inputs: [string, string][], request: unknown, result: Estimate): void {
  const doc = estimateDocument(inputs, request, result);
  const blob = new Blob([JSON.stringify(doc, null, 2)], { type: 'application/json' });
  const a = document.createElement('a');
  a.href = URL.createObjectURL(blob);
  a.download = `estimate-${doc.computedAt.slice(0, 19).replace(/[:T]/g, '-')}.json`;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(a.href), 1000);
}
