/** The proposals list's query as URL parameters (the same names as GET /api/proposals). */
export type ListQuery = {
  state: string;
  parcel: string;
  risk: string;
  q: string;
  sort: string;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
};
export const DEFAULT_QUERY: ListQuery = {
  state: '',
  parcel: '',
  risk: '',
  q: '',
  sort: 'updated',
  dir: 'desc',
  page: 1,
  pageSize: 25,
};

export function toParams(q: ListQuery): URLSearchParams {
  const out = new URLSearchParams();
  for (const [k, v] of Object.entries(q))
    if (v !== '' && v !== DEFAULT_QUERY[k as keyof ListQuery]) out.set(k, String(v));
  return out;
}

export function fromParams(p: URLSearchParams): ListQuery {
  const num = (k: string, d: number) => (/^\d+$/.test(p.get(k) ?? '') ? Number(p.get(k)) : d);
  return {
    state: p.get('state') ?? '',
    parcel: p.get('parcel') ?? '',
    risk: p.get('risk') ?? '',
    q: p.get('q') ?? '',
    sort: p.get('sort') ?? DEFAULT_QUERY.sort,
    dir: p.get('dir') === 'asc' ? 'asc' : 'desc',
    page: num('page', 1),
    pageSize: num('pageSize', 25),
  };
}
