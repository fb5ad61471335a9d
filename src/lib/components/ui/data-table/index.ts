export { default as DataTable } from './data-table.svelte';
export type { DataColumn, DataSort } from './types';
