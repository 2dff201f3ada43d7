import { z } from 'zod';

/** One page of a server-side sorted, filtered list. */
export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export const MAX_PAGE_SIZE = 100;

/** Query fields every paged list accepts (page is zero-based, like MatPaginator). */
export const pagingQuery = {
  page: z.coerce.number().int().min(0).default(0),
  pageSize: z.coerce.number().int().min(1).max(MAX_PAGE_SIZE).default(20),
  dir: z.enum(['asc', 'desc']).default('asc'),
};
