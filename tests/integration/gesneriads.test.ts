import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { Variety, sequelize } from '../../src/lib/server/db';
import { createMigrator, createSeeder } from '../../src/lib/server/db/migrator';
import { exportVarietiesCsv, importVarietiesCsv } from '../../src/lib/server/plants/varieties';

const MIGRATION = '20261215300100-varieties-of-every-gesneriad-group.cjs';
const SEEDER = '20261215300500-demo-gesneriad-division.cjs';
const tag = randomUUID().slice(0, 8);
const made: string[] = [];

async function society(name: string): Promise<string> {
	const id = randomUUID();
	made.push(id);
	await sequelize.query('INSERT INTO societies (id, name, slug) VALUES (:id, :name, :slug)', {
		replacements: { id, name: `${name} ${tag}`, slug: `${name.toLowerCase()}-${tag}` }
	});
	return id;
}

const importCsv = (societyId: string, text: string, goodRowsOnly = false) =>
	sequelize.transaction((transaction) =>
		importVarietiesCsv(societyId, text, { goodRowsOnly, transaction })
	);

afterAll(async () => {
	await sequelize.query('DELETE FROM societies WHERE id IN (:made)', { replacements: { made } });
	await sequelize.close();
});

describe('the migration to gesneriad groups', () => {
	it('keeps every existing variety as an African violet, its habit as growth form', async () => {
		const migrator = createMigrator(sequelize);
		const seeder = createSeeder(sequelize);
		// Back to the table as it was, with the demo's violets (the gesneriad demo removed first).
		await seeder.down({ to: SEEDER });
		await migrator.down({ to: MIGRATION });
		const columns = await sequelize.query<{ name: string }>(
			`SELECT column_name AS name FROM information_schema.columns WHERE table_name = 'varieties'`,
			{ type: QueryTypes.SELECT }
		);
		expect(columns.map((c) => c.name)).not.toContain('growth_form');
		const societyId = await society('Oldtable');
		await sequelize.query(
			`INSERT INTO varieties (id, society_id, name, habit, size_class, blossom_type, is_species)
			 VALUES (gen_random_uuid(), :societyId, 'Old Trailer', 'trailer', 'miniature', 'single', false),
			        (gen_random_uuid(), :societyId, 'Saintpaulia ionantha', 'single_crown', 'standard', 'single', true)`,
			{ replacements: { societyId } }
		);
		const before = await sequelize.query<{ id: string; habit: string }>(
			'SELECT id, habit FROM varieties ORDER BY id',
			{ type: QueryTypes.SELECT }
		);
		expect(before.length).toBeGreaterThanOrEqual(40); // the demo's violets and the two above

		await migrator.up();
		const after = await sequelize.query<{
			id: string;
			name: string;
			habit: string;
			plant_group: string;
			growth_form: string;
			is_species: boolean;
			botanical_name: string | null;
		}>(
			'SELECT id, name, habit, plant_group, growth_form, is_species, botanical_name FROM varieties ORDER BY id',
			{ type: QueryTypes.SELECT }
		);
		expect(after.map((v) => v.id)).toEqual(before.map((v) => v.id));
		for (const v of after) {
			expect(v.plant_group).toBe('african_violet');
			expect(v.growth_form).toBe(v.habit);
			expect(v.botanical_name).toBe(v.is_species ? v.name : null);
		}
		expect(after.find((v) => v.name === 'Old Trailer')?.growth_form).toBe('trailer');
		const classes = await sequelize.query<{ n: number }>(
			`SELECT count(*)::int AS n FROM classes
			  WHERE plant_kind <> 'any' OR genera <> '{}' OR growth_forms <> '{}' OR root_types <> '{}'`,
			{ type: QueryTypes.SELECT }
		);
		expect(classes[0].n).toBe(0);
		// A row written the older way still gets its habit as growth form.
		await sequelize.query(
			`INSERT INTO varieties (id, society_id, name, habit, size_class, blossom_type)
			 VALUES (gen_random_uuid(), :societyId, 'Late Writer', 'trailer', 'standard', 'single')`,
			{ replacements: { societyId } }
		);
		const late = await Variety.findOne({ where: { societyId, name: 'Late Writer' } });
		expect(late?.growthForm).toBe('trailer');
		// A violet cannot be given another group's growth form.
		await expect(
			sequelize.query(`UPDATE varieties SET growth_form = 'rosette' WHERE name = 'Late Writer'`)
		).rejects.toThrow(/varieties_violet_growth_form/);

		await seeder.up();
		const gesneriads = await Variety.count({
			where: { plantGroup: 'sinningia', isSpecies: true }
		});
		expect(gesneriads).toBeGreaterThanOrEqual(3);
		// Going back refuses while gesneriads other than violets are in a registry.
		await expect(migrator.down({ to: MIGRATION })).rejects.toThrow(/African violets/);
		// The later migrations taken down before the refusal come back (the tests after this share
		// the database).
		await migrator.up();
		expect(await migrator.pending()).toEqual([]);
	});
});

describe('the registry CSV with groups', () => {
	const header =
		'name,group,hybridizer,species,botanical_name,growth_form,size_class,blossom_type,blossom_colors,foliage,description';

	it('exports and imports a registry of violets and gesneriads into the same registry', async () => {
		const from = await society('Csvfrom');
		const csv = [
			header,
			'Sinningia pusilla,Sinningia,,yes,Sinningia pusilla,rosette,miniature,single,lavender,plain,A tiny species',
			'Test Lantern,sinningia,I. Maker,no,,Rosette,miniature,single,pink; white,plain,',
			'Test Ribbon,Streptocarpus,I. Maker,no,,rosette,standard,single,blue,variegated,"Blue, with a white throat"',
			'Test Dawn,African violet,I. Maker,no,,single crown,semiminiature,double,pink,plain,',
			'Test Rambler,,I. Maker,no,,trailing,miniature,star,blue,plain,=not a formula',
			'Episcia cupreata,Episcia,,yes,Episcia cupreata,trailing,standard,single,red,plain,'
		].join('\r\n');
		const report = await importCsv(from, csv);
		expect(report).toEqual({ rows: 6, imported: 6, problems: [] });
		const rambler = await Variety.findOne({ where: { societyId: from, name: 'Test Rambler' } });
		// an empty group is an African violet, whose trailing form is a trailer
		expect(rambler).toMatchObject({ plantGroup: 'african_violet', growthForm: 'trailer' });
		expect(rambler?.habit).toBe('trailer');

		const exported = await exportVarietiesCsv(from);
		expect(exported.split('\r\n')[0]).toBe(header);
		expect(exported).toContain("'=not a formula");
		const to = await society('Csvto');
		expect(await importCsv(to, exported)).toEqual({ rows: 6, imported: 6, problems: [] });
		const fields = (v: Variety) => ({
			name: v.name,
			plantGroup: v.plantGroup,
			hybridizer: v.hybridizer,
			isSpecies: v.isSpecies,
			botanicalName: v.botanicalName,
			growthForm: v.growthForm,
			habit: v.habit,
			sizeClass: v.sizeClass,
			blossomType: v.blossomType,
			blossomColours: v.blossomColours,
			foliage: v.foliage,
			description: v.description
		});
		const rows = async (societyId: string) =>
			(await Variety.findAll({ where: { societyId }, order: [['name', 'ASC']] })).map(fields);
		expect(await rows(to)).toEqual(await rows(from));
		expect(await exportVarietiesCsv(to)).toBe(exported);
	});

	it('reports every bad row with its column and keeps nothing of the file', async () => {
		const societyId = await society('Csvbad');
		const csv = [
			header,
			'Good Row,Sinningia,I. Maker,no,,upright,standard,single,red,plain,',
			'No Botanical,Sinningia,,yes,,rosette,miniature,single,red,plain,',
			'Wrong Genus,Sinningia,,yes,Episcia cupreata,rosette,miniature,single,red,plain,',
			'Violet Form,Columnea,I. Maker,no,,single crown,standard,single,red,plain,',
			'Unknown Group,Begonia,I. Maker,no,,upright,standard,single,red,plain,',
			'Strep Mini,Streptocarpus,I. Maker,no,,rosette,semiminiature,single,red,plain,'
		].join('\n');
		const report = await importCsv(societyId, csv);
		expect(report.imported).toBe(0);
		expect(report.problems.map((p) => [p.line, p.reason.split(':')[0]])).toEqual([
			[3, 'botanical_name'],
			[4, 'botanical_name'],
			[5, 'growth_form'],
			[6, 'group'],
			[7, 'size_class']
		]);
		expect(report.problems[2].reason).toBe(
			'growth_form: A Columnea is grown as trailing or upright; give one of those.'
		);
		expect(await Variety.count({ where: { societyId } })).toBe(0);
		const good = await importCsv(societyId, csv, true);
		expect(good.imported).toBe(1);
		expect(await Variety.count({ where: { societyId } })).toBe(1);
	});

	it('reads an older file with habit and blossom_colours as African violets', async () => {
		const societyId = await society('Csvold');
		const csv = [
			'name,hybridizer,habit,size_class,blossom_type,blossom_colours,foliage,species,description',
			'Old Style,X,trailer,miniature,single,pink;white,plain,no,',
			'Old Bad,X,rosette,miniature,single,pink,plain,no,'
		].join('\n');
		const report = await importCsv(societyId, csv, true);
		expect(report.imported).toBe(1);
		expect(report.problems).toEqual([
			{
				line: 3,
				reason: 'habit: An African violet is grown as single crown or trailer; give one of those.'
			}
		]);
		const old = await Variety.findOne({ where: { societyId, name: 'Old Style' } });
		expect(old).toMatchObject({
			plantGroup: 'african_violet',
			growthForm: 'trailer',
			blossomColours: ['pink', 'white']
		});
	});
});
