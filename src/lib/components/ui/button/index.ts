export { default as Button } from './button.svelte';
export { buttonClass } from './variants';
