'use strict';
// The identifier of a compound that an approved plate uses stays as it is: the plate's signed content
// names its compounds by identifier (lib/signoff/plate-content.ts), so a rename would change what an
// approved plate shows and its content hash. The service refuses first with a message that points to
// aliases (lib/compounds/service.ts); this trigger keeps the rule for every other writer.
//
// Races with a sign-off: the trigger first takes a share lock on the rows of the plates that use the
// compound, so a plate being approved at that moment (its sign-off holds the plate row) is waited for,
// and the check that follows, a statement of its own, sees that approval once it has committed.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        create function gatewell_refuse_renaming_signed_compound() returns trigger language plpgsql as $$
        declare
          plate_label text;
        begin
          perform 1 from plates p where p.id in (select w.plate_id from wells w where w.compound_id = old.id)
            order by p.id for share;
          select p.label into plate_label from plates p
            where p.state = 'approved' and p.id in (select w.plate_id from wells w where w.compound_id = old.id)
            order by p.label limit 1;
          if plate_label is not null then
            raise exception 'compound % is used on approved plate %; its identifier cannot change', old.identifier, plate_label
              using errcode = 'P0002';
          end if;
          return new;
        end $$;
        create trigger compounds_identifier_signed before update of identifier on compounds
          for each row when (old.identifier is distinct from new.identifier)
          execute function gatewell_refuse_renaming_signed_compound();
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(
      'drop function if exists gatewell_refuse_renaming_signed_compound() cascade',
    );
  },
};
