'use strict';
// A content revision per plate, kept true by PostgreSQL itself, so that the history tab can tell whether
// the hash it worked out earlier still holds without reading the plate's rows again
// (lib/signoff/plate-content.ts, docs/security.md "Plate content hash").
//
// plate_content_revisions holds one row per plate: a number drawn from a sequence, drawn afresh by the
// triggers below in the same transaction as every insert, update or delete of a row the signed content
// reads (the plate's own content columns, its uploaded file, its wells and their compounds' identifiers,
// its readouts, its fits). A sequence never hands out a number twice, even when a transaction rolls back,
// so a revision names one state of the content. The triggers are statement-level with transition tables
// (one UPDATE per statement, whatever the number of rows; PostgreSQL 15 manual, CREATE TRIGGER,
// "REFERENCING") and run as the schema's owner (SECURITY DEFINER); the app's role may only read the
// revisions: it can neither set a revision back nor lift a trigger (it owns no table).

const CONTENT_TABLES = [
  // table, how its changed rows name their plates (t is the transition table)
  ['wells', 'select t.plate_id from %s t'],
  ['readouts', 'select w.plate_id from %s t join wells w on w.id = t.well_id'],
  ['fits', 'select t.plate_id from %s t'],
  ['uploaded_files', 'select p.id from %s t join plates p on p.uploaded_file_id = t.id'],
];

const TRUNCATED = ['plates', 'compounds', ...CONTENT_TABLES.map(([table]) => table)];

/** The SQL of one table's three triggers and their functions. */
function tableTriggers(table, platesOf) {
  const fn = (op) => `gatewell_plate_content_${table}_${op}`;
  const body = (source) => `
    begin
      update plate_content_revisions r set revision = nextval('plate_content_revision_seq')
        where r.plate_id in (${source});
      return null;
    end`;
  const news = platesOf.replace('%s', 'new_rows');
  const olds = platesOf.replace('%s', 'old_rows');
  return `
    create function ${fn('ins')}() returns trigger language plpgsql security definer set search_path = public, pg_temp as $$${body(news)} $$;
    create function ${fn('upd')}() returns trigger language plpgsql security definer set search_path = public, pg_temp as $$${body(`${news} union ${olds}`)} $$;
    create function ${fn('del')}() returns trigger language plpgsql security definer set search_path = public, pg_temp as $$${body(olds)} $$;
    create trigger ${table}_content_revision_ins after insert on ${table}
      referencing new table as new_rows for each statement execute function ${fn('ins')}();
    create trigger ${table}_content_revision_upd after update on ${table}
      referencing old table as old_rows new table as new_rows for each statement execute function ${fn('upd')}();
    create trigger ${table}_content_revision_del after delete on ${table}
      referencing old table as old_rows for each statement execute function ${fn('del')}();
  `;
}

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      const [[{ me }]] = await queryInterface.sequelize.query('select current_user as me', { transaction });
      const app = process.env.DATABASE_URL
        ? decodeURIComponent(new URL(process.env.DATABASE_URL).username)
        : me;
      await queryInterface.sequelize.query(
        `
        create sequence plate_content_revision_seq;
        create table plate_content_revisions (
          plate_id uuid primary key references plates (id) on delete cascade,
          revision bigint not null
        );
        insert into plate_content_revisions (plate_id, revision)
          select id, nextval('plate_content_revision_seq') from plates order by id;

        -- A new plate gets its row; a change to the plate's content columns (not its workflow columns:
        -- state, version, signers) draws a new revision.
        create function gatewell_plate_content_plates_ins() returns trigger language plpgsql security definer
          set search_path = public, pg_temp as $$
        begin
          insert into plate_content_revisions (plate_id, revision)
            select n.id, nextval('plate_content_revision_seq') from new_rows n;
          return null;
        end $$;
        create trigger plates_content_revision_ins after insert on plates
          referencing new table as new_rows for each statement execute function gatewell_plate_content_plates_ins();
        create function gatewell_plate_content_plates_upd() returns trigger language plpgsql security definer
          set search_path = public, pg_temp as $$
        begin
          update plate_content_revisions r set revision = nextval('plate_content_revision_seq')
            where r.plate_id in (
              select n.id from new_rows n join old_rows o on o.id = n.id
               where (n.label, n.format, n.screen_id, n.supersedes_plate_id, n.imported_by, n.uploaded_file_id, n.qc_summary)
                     is distinct from (o.label, o.format, o.screen_id, o.supersedes_plate_id, o.imported_by, o.uploaded_file_id, o.qc_summary));
          return null;
        end $$;
        create trigger plates_content_revision_upd after update on plates
          referencing old table as old_rows new table as new_rows for each statement execute function gatewell_plate_content_plates_upd();

        -- A compound's identifier is part of the content of every plate that uses it.
        create function gatewell_plate_content_compounds_upd() returns trigger language plpgsql security definer
          set search_path = public, pg_temp as $$
        begin
          update plate_content_revisions r set revision = nextval('plate_content_revision_seq')
            where r.plate_id in (
              select w.plate_id from wells w where w.compound_id in (
                select n.id from new_rows n join old_rows o on o.id = n.id where n.identifier is distinct from o.identifier));
          return null;
        end $$;
        create trigger compounds_content_revision_upd after update on compounds
          referencing old table as old_rows new table as new_rows for each statement execute function gatewell_plate_content_compounds_upd();

        ${CONTENT_TABLES.map(([table, platesOf]) => tableTriggers(table, platesOf)).join('\n')}

        -- TRUNCATE (which the app's role may not) draws a new revision for every plate.
        create function gatewell_plate_content_truncated() returns trigger language plpgsql security definer
          set search_path = public, pg_temp as $$
        begin
          update plate_content_revisions set revision = nextval('plate_content_revision_seq');
          return null;
        end $$;
        ${TRUNCATED.map((t) => `create trigger ${t}_content_revision_trunc after truncate on ${t} for each statement execute function gatewell_plate_content_truncated();`).join('\n')}
        `,
        { transaction },
      );
      if (app !== me)
        await queryInterface.sequelize.query(
          `revoke insert, update, delete, truncate on plate_content_revisions from "${app.replace(/"/g, '""')}";
           grant select on plate_content_revisions to "${app.replace(/"/g, '""')}";`,
          { transaction },
        );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      const tables = ['plates', 'compounds', ...CONTENT_TABLES.map(([table]) => table)];
      const functions = [
        'gatewell_plate_content_truncated',
        'gatewell_plate_content_plates_ins',
        'gatewell_plate_content_plates_upd',
        'gatewell_plate_content_compounds_upd',
        ...CONTENT_TABLES.flatMap(([table]) =>
          ['ins', 'upd', 'del'].map((op) => `gatewell_plate_content_${table}_${op}`),
        ),
      ];
      await queryInterface.sequelize.query(
        `${tables.map((t) => ['ins', 'upd', 'del', 'trunc'].map((op) => `drop trigger if exists ${t}_content_revision_${op} on ${t};`).join('\n')).join('\n')}
         ${functions.map((f) => `drop function if exists ${f}();`).join('\n')}
         drop table if exists plate_content_revisions;
         drop sequence if exists plate_content_revision_seq;`,
        { transaction },
      );
    });
  },
};
