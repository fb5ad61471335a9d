export { default as PageHeader } from './page-header.svelte';
