'use strict';
// Reads that a year of data (docs/performance.md, "A year of data") measured slow with pg_stat_statements:
//
// - The plate list's well and failing-well counts (lib/plates/queries.ts, selectPlates) counted a page's
//   19,200 wells and probed the failing readouts of each: 870 ms a page, PostgreSQL's plan reading all
//   1.92 M wells. plate_well_tallies keeps both counts per plate, worked out again by statement-level
//   triggers (transition tables) in the same transaction as every insert, update or delete of the plate's
//   wells or readouts, whoever writes them; the app's role may only read it.
// - The audit filter's kinds of event (lib/audit/queries.ts, selectAuditActions) read every event;
//   audit_events_action lets a loose index scan step from one kind to the next.
// - The filter's recent plate labels (selectPlateAndCompoundNames: group by label, max(imported_at)) read
//   every plate row with its QC summary; plates_label_imported answers it from the index alone.

const COUNT_SQL = `
  update plate_well_tallies tally
     set wells = (select count(*) from wells w where w.plate_id = tally.plate_id),
         failing_wells = (select count(distinct r.well_id) from readouts r join wells w on w.id = r.well_id
                           where w.plate_id = tally.plate_id and jsonb_array_length(r.qc_reasons) > 0)
   where tally.plate_id in (%s)`;

// table, how its changed rows name their plates (t is the transition table), and which updated rows can
// change a count (an exclusion or a new block leaves the counts as they are, and draws no recount)
const TABLES = [
  ['wells', 'select t.plate_id from %s t', 'n.plate_id is distinct from o.plate_id'],
  [
    'readouts',
    'select w.plate_id from %s t join wells w on w.id = t.well_id',
    'n.well_id is distinct from o.well_id or (jsonb_array_length(n.qc_reasons) > 0) is distinct from (jsonb_array_length(o.qc_reasons) > 0)',
  ],
];

function fn(name, source) {
  return `create function ${name}() returns trigger language plpgsql security definer set search_path = public, pg_temp as $$
    begin
      ${COUNT_SQL.replace('%s', source)};
      return null;
    end $$;`;
}

function tableTriggers(table, platesOf, counted) {
  const news = platesOf.replace('%s', 'new_rows');
  const olds = platesOf.replace('%s', 'old_rows');
  const changed = `(select n.* from new_rows n join old_rows o on o.id = n.id where ${counted})`;
  const changedOld = `(select o.* from new_rows n join old_rows o on o.id = n.id where ${counted})`;
  const name = (op) => `gatewell_plate_tally_${table}_${op}`;
  return `
    ${fn(name('ins'), news)}
    ${fn(name('upd'), `${platesOf.replace('%s', changed)} union ${platesOf.replace('%s', changedOld)}`)}
    ${fn(name('del'), olds)}
    create trigger ${table}_tally_ins after insert on ${table}
      referencing new table as new_rows for each statement execute function ${name('ins')}();
    create trigger ${table}_tally_upd after update on ${table}
      referencing old table as old_rows new table as new_rows for each statement execute function ${name('upd')}();
    create trigger ${table}_tally_del after delete on ${table}
      referencing old table as old_rows for each statement execute function ${name('del')}();
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
        create table plate_well_tallies (
          plate_id uuid primary key references plates (id) on delete cascade,
          wells integer not null default 0,
          failing_wells integer not null default 0
        );
        insert into plate_well_tallies (plate_id, wells, failing_wells)
          select p.id, coalesce(w.n, 0), coalesce(f.n, 0) from plates p
            left join (select plate_id, count(*)::int as n from wells group by plate_id) w on w.plate_id = p.id
            left join (select w.plate_id, count(distinct r.well_id)::int as n from readouts r join wells w on w.id = r.well_id
                        where jsonb_array_length(r.qc_reasons) > 0 group by w.plate_id) f on f.plate_id = p.id;

        create function gatewell_plate_tally_plates_ins() returns trigger language plpgsql security definer
          set search_path = public, pg_temp as $$
        begin
          insert into plate_well_tallies (plate_id) select n.id from new_rows n;
          return null;
        end $$;
        create trigger plates_tally_ins after insert on plates
          referencing new table as new_rows for each statement execute function gatewell_plate_tally_plates_ins();
        ${TABLES.map(([table, platesOf, counted]) => tableTriggers(table, platesOf, counted)).join('\n')}

        create index audit_events_action on audit_events (action);
        create index plates_label_imported on plates (label, imported_at);
        `,
        { transaction },
      );
      if (app !== me)
        await queryInterface.sequelize.query(
          `revoke insert, update, delete, truncate on plate_well_tallies from "${app.replace(/"/g, '""')}";
           grant select on plate_well_tallies to "${app.replace(/"/g, '""')}";`,
          { transaction },
        );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `drop index if exists plates_label_imported;
         drop index if exists audit_events_action;
         drop trigger if exists plates_tally_ins on plates;
         drop function if exists gatewell_plate_tally_plates_ins();
         ${TABLES.map(([table]) =>
           ['ins', 'upd', 'del']
             .map(
               (op) =>
                 `drop trigger if exists ${table}_tally_${op} on ${table}; drop function if exists gatewell_plate_tally_${table}_${op}();`,
             )
             .join('\n'),
         ).join('\n')}
         drop table if exists plate_well_tallies;`,
        { transaction },
      );
    });
  },
};
