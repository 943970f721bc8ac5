'use strict';
// Each target keeps its model conductance for every neuron preset, not only the screen's current one
// (targets.conductance stays the mapping in the current preset, which fits and forecasts read). When an
// admin switches a screen's preset, each target takes its mapping in the new preset from here, or the
// default for its name (lib/science/neuron/presets/target-conductance.ts).
// Existing targets start with their current mapping under their screen's preset.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        alter table targets
          add column conductance_by_preset jsonb not null default '{}',
          add constraint targets_conductance_by_preset_object check (jsonb_typeof(conductance_by_preset) = 'object');

        update targets t
           set conductance_by_preset = jsonb_build_object(s.neuron_preset, t.conductance)
          from screens s
         where s.id = t.screen_id;
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(
      `alter table targets drop constraint targets_conductance_by_preset_object, drop column conductance_by_preset;`,
    );
  },
};
