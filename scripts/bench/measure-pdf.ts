/**
 * The award sheets PDF of a whole show, built in this process on its own so that its time and
 * peak memory (resident set, as the kernel counts it) are the PDF's alone. Prints one JSON line.
 *   node --import tsx scripts/bench/measure-pdf.ts <showId>
 */
import { loadShowResults } from '../../src/lib/server/results/show-results';
import { renderAwardSheets } from '../../src/lib/server/results/documents/award-sheets';
const showId = process.argv[2];

/** The award sheets as the chair downloads them: the published results, then the PDF. */
async function buildAwardSheets(id: string): Promise<Buffer> {
	const results = await loadShowResults(id);
	if (!results) throw new Error('The show has no published results.');
	return renderAwardSheets(results, 'letter');
}

async function main(): Promise<Record<string, unknown>> {
	const started = performance.now();
	let pdf: Buffer;
	try {
		pdf = await buildAwardSheets(showId);
	} catch (err) {
		return { measured: false, reason: (err as Error).message };
	}
	return {
		measured: true,
		seconds: Math.round((performance.now() - started) / 10) / 100,
		peakRssMb: Math.round(process.resourceUsage().maxRSS / 1024),
		bytes: pdf.length
	};
}

main()
	.then((out) => process.stdout.write(`${JSON.stringify(out)}\n`))
	.catch((err: unknown) => {
		process.stdout.write(`${JSON.stringify({ measured: false, reason: String(err) })}\n`);
	})
	.finally(() => process.exit(0));
