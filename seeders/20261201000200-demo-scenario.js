'use strict';
// The invented demo scenario (screens, targets, compounds, batches, plates), written through Gatewell's
// own TypeScript services by scripts/seed-demo.ts so that it is validated and audited like user input.
const { execFileSync } = require('node:child_process');
const path = require('node:path');

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up() {
    const root = path.resolve(__dirname, '..');
    execFileSync(process.execPath, ['--conditions=react-server', '--import', 'tsx', 'scripts/seed-demo.ts'], {
      cwd: root,
      stdio: 'inherit',
      env: process.env,
    });
  },

  async down() {
    // Demo rows are referenced by the append-only audit trail; reset the database to remove them.
  },
};
