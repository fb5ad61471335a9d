'use strict';

const { randomUUID } = require('node:crypto');

/**
 * A small gesneriad division for the demo: gesneriads other than African violets in the Larkspur
 * Valley registry and a division of classes for them in its spring show. The hybrids and their
 * hybridizers are made up for the demo; the species are real botanical names (botany, not brands).
 */

const SOCIETY = 'larkspur-valley';
const SPECIES_SCALE = 'Species (Larkspur Valley setting)';
const BUILT_IN_SCALE = 'Single-crowned standard, semiminiature and miniature plants';

/** Invented hybridizers. */
const H = {
	aldous: 'Maren Aldous-Fitch',
	okonkwo: 'Tertius Okonkwo-Lane'
};

/**
 * [name, group, hybridizer or null (a species), growth form, size class, blossom type, colors,
 * foliage, description]. A species' name is its botanical name.
 */
// prettier-ignore
const GESNERIADS = [
	// Sinningia: miniatures are judged by the leaf blade (at most 2.5 in)
	['Sinningia pusilla', 'sinningia', null, 'rosette', 'miniature', 'single', ['lavender'], 'plain', 'A tiny tuberous rosette with lavender slipper flowers.'],
	['Sinningia muscicola', 'sinningia', null, 'rosette', 'miniature', 'single', ['lavender'], 'plain', 'A very small species with pale lavender flowers.'],
	['Sinningia leucotricha', 'sinningia', null, 'upright', 'standard', 'single', ['coral'], 'plain', 'Silver-haired leaves on upright stems; coral tubular flowers.'],
	['Cinder Thimble', 'sinningia', H.aldous, 'rosette', 'miniature', 'single', ['red'], 'plain', 'A miniature hybrid with small red bells.'],
	['Pocket Lantern', 'sinningia', H.aldous, 'rosette', 'miniature', 'single', ['pink', 'white'], 'plain', 'Pink and white slippers over a flat rosette of small leaves.'],
	['Dusk Over Tern Bay', 'sinningia', H.okonkwo, 'rosette', 'standard', 'double', ['purple'], 'plain', 'Large double purple flowers on a broad rosette.'],
	// Streptocarpus (other than the African violets of section Saintpaulia)
	['Streptocarpus saxorum', 'streptocarpus', null, 'upright', 'standard', 'single', ['lavender'], 'plain', 'Small fleshy leaves on branching stems.'],
	['Evening Ribbon', 'streptocarpus', H.okonkwo, 'rosette', 'standard', 'single', ['blue', 'white'], 'plain', 'Blue trumpets with a white throat, many to a stem.'],
	['Harrow Mist', 'streptocarpus', H.okonkwo, 'rosette', 'standard', 'single', ['white'], 'variegated', 'White flowers over cream-variegated strap leaves.'],
	// Episcia, Columnea, Aeschynanthus: trailing, fibrous-rooted
	['Episcia cupreata', 'episcia', null, 'trailing', 'standard', 'single', ['red'], 'plain', 'Coppery quilted leaves on runners; red flowers.'],
	['Copper Meadow', 'episcia', H.aldous, 'trailing', 'standard', 'single', ['orange'], 'variegated', 'Pink and silver leaves, orange flowers.'],
	['Columnea microphylla', 'columnea', null, 'trailing', 'standard', 'single', ['red'], 'plain', 'Long trailing stems of tiny round leaves.'],
	['Aeschynanthus radicans', 'aeschynanthus', null, 'trailing', 'standard', 'single', ['red'], 'plain', 'Red tubular flowers from dark calyces.'],
	// Rhizomatous
	['Kohleria amabilis', 'kohleria', null, 'upright', 'standard', 'single', ['pink'], 'plain', 'Dark-veined leaves, spotted pink flowers.'],
	['Ember Stair', 'kohleria', H.okonkwo, 'upright', 'standard', 'single', ['orange'], 'plain', 'Orange speckled tubes on upright stems.'],
	['Achimenes erecta', 'achimenes', null, 'upright', 'standard', 'single', ['red'], 'plain', 'Small scarlet flowers on upright stems.'],
	// Old World rosettes
	['Primulina tamiana', 'primulina', null, 'rosette', 'standard', 'single', ['white'], 'plain', 'A small rosette of round, hairy leaves; white flowers.'],
	['Silver Ledger', 'primulina', H.aldous, 'rosette', 'standard', 'single', ['lavender'], 'variegated', 'Silver-netted leaves in a flat rosette.'],
	['Petrocosmea kerrii', 'petrocosmea', null, 'rosette', 'standard', 'single', ['white'], 'plain', 'White flowers over a tight, velvety rosette.']
];

/** The division and its classes: [code, name, rules]. */
const DIVISION = { code: 'G', name: 'Gesneriads other than African violets' };
// prettier-ignore
const CLASSES = [
	['40', 'Miniature Sinningia species and hybrids (leaf blade at most 2.5 in)', { genera: ['sinningia'], sizes: ['miniature'] }],
	['41', 'Other Sinningia species', { genera: ['sinningia'], speciesOnly: true, scale: SPECIES_SCALE }],
	['42', 'Other Sinningia hybrids, rosette growth', { genera: ['sinningia'], growthForms: ['rosette'] }],
	['43', 'Streptocarpus hybrids', { genera: ['streptocarpus'] }],
	['44', 'Trailing gesneriads (Episcia, Columnea, Aeschynanthus)', { genera: ['episcia', 'columnea', 'aeschynanthus'], growthForms: ['trailing'] }],
	['45', 'Rhizomatous gesneriads', { rootTypes: ['rhizomatous'] }],
	['46', 'Primulina and Petrocosmea', { genera: ['primulina', 'petrocosmea'] }]
];

module.exports = {
	async up(queryInterface, Sequelize) {
		const texts = { type: Sequelize.ARRAY(Sequelize.STRING(40)) };
		await queryInterface.sequelize.transaction(async (transaction) => {
			const one = async (sql, replacements) =>
				(await queryInterface.sequelize.query(sql, { replacements, transaction }))[0][0];
			const society = await one('SELECT id FROM societies WHERE slug = :slug', { slug: SOCIETY });
			if (!society) return; // the demo seed is not there
			const show = await one(
				`SELECT id FROM shows WHERE society_id = :id AND name LIKE 'Spring Show %'
				  ORDER BY judging_day DESC LIMIT 1`,
				{ id: society.id }
			);
			const scale = async (name) =>
				(
					await one(
						`SELECT id FROM scales WHERE name = :name AND (society_id = :id OR society_id IS NULL)
						  ORDER BY society_id NULLS LAST, version DESC LIMIT 1`,
						{ name, id: society.id }
					)
				)?.id ?? null;
			const now = new Date();
			await queryInterface.bulkInsert(
				'varieties',
				GESNERIADS.map(([name, group, hybridizer, form, size, type, colors, foliage, about]) => ({
					id: randomUUID(),
					society_id: society.id,
					name,
					plant_group: group,
					hybridizer,
					growth_form: form,
					habit: form === 'trailing' ? 'trailer' : 'single_crown',
					size_class: size,
					blossom_type: type,
					blossom_colours: colors,
					foliage,
					is_species: hybridizer === null,
					botanical_name: hybridizer === null ? name : null,
					description: about,
					created_at: now,
					updated_at: now
				})),
				{ transaction },
				{ blossom_colours: texts }
			);
			if (!show) return;
			const last = await one(
				'SELECT coalesce(max(position), 0) AS n FROM divisions WHERE show_id = :id',
				{ id: show.id }
			);
			const divisionId = randomUUID();
			await queryInterface.bulkInsert(
				'divisions',
				[
					{
						id: divisionId,
						show_id: show.id,
						code: DIVISION.code,
						name: DIVISION.name,
						kind: 'horticulture',
						position: Number(last.n) + 1
					}
				],
				{ transaction }
			);
			const lastClass = await one(
				'SELECT coalesce(max(position), 0) AS n FROM classes WHERE show_id = :id',
				{ id: show.id }
			);
			const rows = [];
			for (const [i, [code, name, r]] of CLASSES.entries()) {
				rows.push({
					id: randomUUID(),
					show_id: show.id,
					division_id: divisionId,
					code,
					name,
					position: Number(lastClass.n) + i + 1,
					habit: 'any',
					size_classes: r.sizes ?? [],
					plant_kind: 'other_gesneriad',
					genera: r.genera ?? [],
					growth_forms: r.growthForms ?? [],
					root_types: r.rootTypes ?? [],
					species_only: Boolean(r.speciesOnly),
					scale_id: await scale(r.scale ?? BUILT_IN_SCALE)
				});
			}
			await queryInterface.bulkInsert(
				'classes',
				rows,
				{ transaction },
				{
					size_classes: texts,
					genera: texts,
					growth_forms: texts,
					root_types: texts
				}
			);
		});
	},

	async down(queryInterface) {
		await queryInterface.sequelize.transaction(async (transaction) => {
			const run = (sql) =>
				queryInterface.sequelize.query(sql, { replacements: { slug: SOCIETY }, transaction });
			const society = 'SELECT id FROM societies WHERE slug = :slug';
			const shows = `SELECT id FROM shows WHERE society_id IN (${society})`;
			await run(
				`DELETE FROM entries WHERE class_id IN (SELECT c.id FROM classes c JOIN divisions d
				   ON d.id = c.division_id WHERE d.show_id IN (${shows}) AND d.code = '${DIVISION.code}')`
			);
			await run(`DELETE FROM divisions WHERE show_id IN (${shows}) AND code = '${DIVISION.code}'`);
			await run(
				`DELETE FROM plants WHERE variety_id IN (SELECT id FROM varieties
				   WHERE society_id IN (${society}) AND plant_group <> 'african_violet')`
			);
			await run(
				`DELETE FROM entries WHERE variety_id IN (SELECT id FROM varieties
				   WHERE society_id IN (${society}) AND plant_group <> 'african_violet')`
			);
			await run(
				`DELETE FROM varieties WHERE society_id IN (${society}) AND plant_group <> 'african_violet'`
			);
		});
	}
};
