'use strict';
// Each person's layout of a grid (which columns are shown, their order and widths), kept on the server so
// that it follows the person to the next visit and to another browser. One row per person and grid;
// removing the row is "reset", the grid's own layout again. A layout is how a person likes to read a
// grid, not a record of the science: it is not audited (the audit trail keeps changes to data and access).

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      create table user_grid_layouts (
        user_id uuid not null references users(id),
        grid text not null check (grid in ('plate-wells')),
        -- [{"id": column id, "hidden": boolean, "width": pixels or null}, ...] in the order shown.
        columns jsonb not null check (jsonb_typeof(columns) = 'array' and jsonb_array_length(columns) between 1 and 100),
        updated_at timestamptz not null default now(),
        primary key (user_id, grid)
      );
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query('drop table user_grid_layouts;');
  },
};
