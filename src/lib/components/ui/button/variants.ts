export type ButtonVariant = 'primary' | 'secondary' | 'quiet' | 'danger';
export type ButtonSize = 'md' | 'lg';

const base =
	'inline-flex min-h-touch min-w-touch items-center justify-center gap-2 rounded-lg px-4 font-semibold no-underline transition-colors disabled:cursor-not-allowed disabled:opacity-60';

const variants: Record<ButtonVariant, string> = {
	primary: 'bg-leaf-600 text-white hover:bg-leaf-700 hover:text-white',
	secondary: 'border border-leaf-600 bg-card text-leaf-700 hover:bg-leaf-50 hover:text-leaf-800',
	quiet: 'text-leaf-700 hover:bg-leaf-50 hover:text-leaf-800',
	danger: 'bg-alert-600 text-white hover:bg-alert-700 hover:text-white'
};

const sizes: Record<ButtonSize, string> = {
	md: 'text-body',
	lg: 'text-lead px-6 py-2'
};

/** Tailwind classes of a button or of a link that looks like one. */
export function buttonClass(variant: ButtonVariant = 'primary', size: ButtonSize = 'md'): string {
	return `${base} ${variants[variant]} ${sizes[size]}`;
}
