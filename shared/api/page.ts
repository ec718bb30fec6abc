/** One page of a server-side paginated list. */
export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}
