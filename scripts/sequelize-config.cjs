// Connection settings for sequelize-cli: every environment reads DATABASE_URL, set by Gatewell's scripts.
const url = process.env.DATABASE_URL;
if (!url) {
  throw new Error('DATABASE_URL is not set: run migrations through scripts/start.sh or scripts/test.sh');
}

const settings = { url, dialect: 'postgres', logging: false, seederStorage: 'sequelize', seederStorageTableName: 'sequelize_seeds' };

module.exports = { development: settings, test: settings, production: settings };
