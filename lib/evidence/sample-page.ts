/**
 * One page of a run's samples. A run imported from a 100,000-row file would otherwise render
 * every sample and its working at once; the page number lives in the URL (`?samples=3`) so a
 * page can be linked and reloaded. An out-of-range or unreadable page shows the nearest real one.
 */
export const SAMPLES_PER_PAGE = 50;

export interface SamplePage<T> {
  items: T[];
  /** 1-based. */
  page: number;
  pages: number;
  /** 1-based positions of the first and last item shown; 0 and 0 when there are none. */
  from: number;
  to: number;
  total: number;
}

export function readSamplePage(param: string | string[] | undefined): number {
  const value = Array.isArray(param) ? param[0] : param;
  return value && /^\d{1,7}$/.test(value) ? Math.max(1, Number(value)) : 1;
}

export function samplePage<T>(
  all: readonly T[],
  requested: number,
  size = SAMPLES_PER_PAGE,
): SamplePage<T> {
  const total = all.length;
  const pages = Math.max(1, Math.ceil(total / size));
  const page = Math.min(Math.max(1, Math.floor(requested) || 1), pages);
  const start = (page - 1) * size;
  const items = all.slice(start, start + size);
  return {
    items,
    page,
    pages,
    from: items.length ? start + 1 : 0,
    to: start + items.length,
    total,
  };
}
