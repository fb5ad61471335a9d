export { default as Notice } from './notice.svelte';
