/**
 * Draws the judging app's icons (static/icons) from static/favicon.svg with sharp: plain ones
 * and "maskable" ones with the safe margin Android crops to. Run again after changing the logo:
 * npx tsx scripts/make-icons.ts
 */
import sharp from 'sharp';
import { readFileSync } from 'node:fs';

const logo = readFileSync('static/favicon.svg');
const PAPER = '#fbfaf6';

for (const size of [192, 512]) {
	await sharp(logo, { density: 72 * (size / 32) })
		.resize(size, size)
		.png()
		.toFile(`static/icons/judging-${size}.png`);
	// Maskable: the logo in the middle 80 %, on the page color, so any mask shape keeps it whole.
	const inner = Math.round(size * 0.8);
	const art = await sharp(logo, { density: 72 * (inner / 32) })
		.resize(inner, inner)
		.png()
		.toBuffer();
	await sharp({ create: { width: size, height: size, channels: 4, background: PAPER } })
		.composite([{ input: art, gravity: 'center' }])
		.png()
		.toFile(`static/icons/judging-maskable-${size}.png`);
}
