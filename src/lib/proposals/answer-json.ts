/**
 * The JSON text of an assessment answer (pure), written faster than one JSON.stringify of the whole:
 * the estimates of parcels of one kind share their factors and cautions arrays (carbon/estimate.ts,
 * estimateBatch), so each shared array is written once and its text reused. The text parses to the
 * same value as JSON.stringify's (only the order of keys inside an estimate differs).
 */
type Estimate = { factors: unknown[]; cautions: unknown[] } & Record<string, unknown>;

function withTail(objectText: string, tail: string): string {
  return objectText === '{}' ? `{${tail}}` : `${objectText.slice(0, -1)},${tail}}`;
}

export function assessmentAnswerJson(
  answer: { parcels: ({ estimate: Estimate | null } & Record<string, unknown>)[] } & Record<string, unknown>,
): string {
  const memo = new Map<unknown[], string>();
  const once = (a: unknown[]) => {
    let text = memo.get(a);
    if (text === undefined) memo.set(a, (text = JSON.stringify(a)));
    return text;
  };
  const parcels = answer.parcels.map(({ estimate, ...rest }) => {
    if (!estimate) return withTail(JSON.stringify(rest), '"estimate":null');
    const { factors, cautions, ...figures } = estimate;
    const estimateText = withTail(JSON.stringify(figures), `"factors":${once(factors)},"cautions":${once(cautions)}`);
    return withTail(JSON.stringify(rest), `"estimate":${estimateText}`);
  });
  const { parcels: _p, ...head } = answer;
  return withTail(JSON.stringify(head), `"parcels":[${parcels.join(',')}]`);
}
