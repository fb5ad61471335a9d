export { default as Select } from './select.svelte';
