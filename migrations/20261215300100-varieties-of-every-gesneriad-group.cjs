'use strict';

/**
 * Gesneriads beyond African violets. A variety gets its group (African violet, or a gesneriad
 * genus such as Sinningia), its growth form (for violets: single crown or trailer, the habit it
 * had) and, for a species, its botanical name. Every variety that exists is an African violet
 * with its habit as its growth form; a species keeps its name as its botanical name.
 * A class can ask for a group (violets or the other gesneriads), genera, growth forms and root
 * types; every existing class asks for none of them. A row written with a habit and no growth
 * form (older code) gets its habit as growth form.
 */
module.exports = {
	async up(queryInterface, Sequelize) {
		const transaction = await queryInterface.sequelize.transaction();
		try {
			const options = { transaction };
			await queryInterface.addColumn(
				'varieties',
				'plant_group',
				{ type: Sequelize.STRING(32), allowNull: false, defaultValue: 'african_violet' },
				options
			);
			await queryInterface.addColumn(
				'varieties',
				'growth_form',
				{ type: Sequelize.STRING(24), allowNull: true },
				options
			);
			await queryInterface.addColumn(
				'varieties',
				'botanical_name',
				{ type: Sequelize.STRING(160), allowNull: true },
				options
			);
			await queryInterface.sequelize.query(
				`UPDATE varieties SET growth_form = habit,
				        botanical_name = CASE WHEN is_species THEN name ELSE NULL END`,
				options
			);
			await queryInterface.changeColumn(
				'varieties',
				'growth_form',
				{ type: Sequelize.STRING(24), allowNull: false },
				options
			);
			await queryInterface.sequelize.query(
				`ALTER TABLE varieties
				   ADD CONSTRAINT varieties_violet_growth_form
				       CHECK (plant_group <> 'african_violet' OR growth_form IN ('single_crown','trailer'))`,
				options
			);
			// Rows written the older way (habit only) get their habit as growth form.
			await queryInterface.sequelize.query(
				`CREATE FUNCTION varieties_growth_form_from_habit() RETURNS trigger AS $$
				 BEGIN
				   NEW.growth_form := COALESCE(NEW.growth_form, NEW.habit);
				   RETURN NEW;
				 END $$ LANGUAGE plpgsql;
				 CREATE TRIGGER varieties_growth_form_default BEFORE INSERT OR UPDATE ON varieties
				   FOR EACH ROW EXECUTE FUNCTION varieties_growth_form_from_habit();`,
				options
			);
			const texts = () => ({
				type: Sequelize.ARRAY(Sequelize.STRING(40)),
				allowNull: false,
				defaultValue: []
			});
			await queryInterface.addColumn(
				'classes',
				'plant_kind',
				{ type: Sequelize.STRING(24), allowNull: false, defaultValue: 'any' },
				options
			);
			await queryInterface.addColumn('classes', 'genera', texts(), options);
			await queryInterface.addColumn('classes', 'growth_forms', texts(), options);
			await queryInterface.addColumn('classes', 'root_types', texts(), options);
			await queryInterface.sequelize.query(
				`ALTER TABLE classes
				   ADD CONSTRAINT classes_plant_kind_known
				       CHECK (plant_kind IN ('any','african_violet','other_gesneriad'))`,
				options
			);
			await transaction.commit();
		} catch (e) {
			await transaction.rollback();
			throw e;
		}
	},

	async down(queryInterface) {
		const transaction = await queryInterface.sequelize.transaction();
		try {
			const options = { transaction };
			// Only African violets fit the older table: the other groups' varieties cannot go back.
			const [rows] = await queryInterface.sequelize.query(
				`SELECT count(*)::int AS n FROM varieties WHERE plant_group <> 'african_violet'`,
				options
			);
			if (rows[0].n > 0) {
				throw new Error(
					`${rows[0].n} varieties are gesneriads other than African violets; remove them before going back.`
				);
			}
			await queryInterface.sequelize.query(
				`UPDATE varieties SET habit = growth_form WHERE habit <> growth_form`,
				options
			);
			await queryInterface.sequelize.query(
				`DROP TRIGGER varieties_growth_form_default ON varieties;
				 DROP FUNCTION varieties_growth_form_from_habit();`,
				options
			);
			for (const column of ['plant_kind', 'genera', 'growth_forms', 'root_types']) {
				await queryInterface.removeColumn('classes', column, options);
			}
			for (const column of ['plant_group', 'growth_form', 'botanical_name']) {
				await queryInterface.removeColumn('varieties', column, options);
			}
			await transaction.commit();
		} catch (e) {
			await transaction.rollback();
			throw e;
		}
	}
};
