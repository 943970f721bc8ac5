// Connection settings for sequelize-cli, set by Gatewell's scripts: migrations and seeders run as the
// schema's owner (DATABASE_OWNER_URL); without it, as the app's own role (DATABASE_URL), a single-role
// set-up. The migration 20261205000100 reads DATABASE_URL to know the app's role it grants to.
const url = process.env.DATABASE_OWNER_URL || process.env.DATABASE_URL;
if (!url) {
  throw new Error(
    'DATABASE_OWNER_URL and DATABASE_URL are not set: run migrations through scripts/start.sh or scripts/test.sh',
  );
}

const settings = {
  url,
  dialect: 'postgres',
  logging: false,
  seederStorage: 'sequelize',
  seederStorageTableName: 'sequelize_seeds',
};

module.exports = { development: settings, test: settings, production: settings };
