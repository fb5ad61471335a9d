export { default as ConfirmForm } from './confirm-form.svelte';
export { default as ConfirmFallback } from './confirm-fallback.svelte';
