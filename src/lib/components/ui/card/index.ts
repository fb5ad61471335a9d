export { default as Card } from './card.svelte';
