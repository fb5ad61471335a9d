export { default as Field } from './field.svelte';
