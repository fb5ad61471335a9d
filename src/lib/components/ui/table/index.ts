export { default as Table } from './table.svelte';
