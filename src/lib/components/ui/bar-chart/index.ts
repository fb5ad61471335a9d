export { default as BarChart } from './bar-chart.svelte';
