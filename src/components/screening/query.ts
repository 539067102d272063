/** The screening table's query as URL parameters (the same names as GET /api/screening). */
export type ScreeningQuery = {
  level: string;
  region: string;
  sort: string;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
};
export const DEFAULT_SCREENING_QUERY: ScreeningQuery = {
  level: '',
  region: '',
  sort: 'level',
  dir: 'desc',
  page: 1,
  pageSize: 25,
};

export function screeningParams(q: ScreeningQuery): URLSearchParams {
  const out = new URLSearchParams();
  for (const [k, v] of Object.entries(q))
    if (v !== '' && v !== DEFAULT_SCREENING_QUERY[k as keyof ScreeningQuery]) out.set(k, String(v));
  return out;
}

export function screeningQueryFrom(p: URLSearchParams): ScreeningQuery {
  const num = (k: string, d: number) => (/^\d+$/.test(p.get(k) ?? '') ? Number(p.get(k)) : d);
  return {
    level: /^[1-4]$/.test(p.get('level') ?? '') ? p.get('level')! : '',
    region: p.get('region') ?? '',
    sort: p.get('sort') ?? DEFAULT_SCREENING_QUERY.sort,
    dir: p.get('dir') === 'asc' ? 'asc' : 'desc',
    page: num('page', 1),
    pageSize: num('pageSize', 25),
  };
}
