import { expect, test, type Page } from '@playwright/test';
import { waitForMessages } from '../support/fake-smtp';
import { dbRow, PEOPLE, shot, signedIn, type Person } from './signoff-support';

// The whole sign-off of one demo plate by four people in four browsers, with the notifications
// arriving in this test run's fake SMTP server (scripts/fake-smtp.sh, started by scripts/test.sh).
const LABEL = 'KV-P01';

test('a plate goes through sign-off as chemist, biologist and two approvers, with e-mail at each step', async ({
  browser,
}) => {
  test.setTimeout(240_000);
  const plate = await dbRow<{ id: string; state: string }>('select id, state from plates where label = $1', [
    LABEL,
  ]);
  expect(plate?.state).toBe('imported');
  const plateId = plate!.id;
  const mailTo = (who: Person, subject: string, count = 1) =>
    waitForMessages(
      (m) =>
        m.envelope.to.includes(PEOPLE[who].email) &&
        m.text.includes(`/plates/${plateId}/history`) &&
        m.subject.includes(subject),
      count,
      40_000,
    );
  const page: Partial<Record<Person, Page>> = {};
  const as = async (who: Person) => (page[who] ??= await signedIn(browser, who));
  const open = async (who: Person) => {
    const p = await as(who);
    await p.goto(`/plates/${plateId}/history`);
    await expect(p.getByRole('heading', { name: 'Sign-off' })).toBeVisible();
    return p;
  };
  const sign = async (p: Page, button: string, comment = '', password?: string) => {
    if (comment) await p.getByLabel(/^Comment/).fill(comment);
    await p.getByLabel('Your password, to sign').fill(password ?? '');
    await p.getByRole('button', { name: `Sign: ${button}` }).click();
  };
  const signed = (p: Page, state: string) =>
    expect(p.getByRole('status').filter({ hasText: `Signed. Plate ${LABEL} is now ${state}` })).toBeVisible();

  // The chemist finds the plate in "My work" and verifies its compound map.
  const chemist = await as('chemist');
  await chemist.getByRole('link', { name: 'My work' }).click();
  await chemist.getByRole('link', { name: LABEL }).click();
  await expect(chemist.getByText('Compound map verified: each well holds the compound')).toBeVisible();
  await shot(chemist, 'signoff-1-chemist-before-verifying');
  await sign(chemist, 'Verify the compound map', '', PEOPLE.chemist.password);
  await signed(chemist, 'verified');
  await mailTo('biologist', 'compound map verified');

  // The biologist submits it; both approvers hear of it.
  const biologist = await open('biologist');
  await sign(biologist, 'Submit for approval', 'QC and fits reviewed.', PEOPLE.biologist.password);
  await signed(biologist, 'submitted');
  await mailTo('approver', 'submitted for approval');
  await mailTo('approver2', 'submitted for approval');

  // The first approver returns it: without a comment first, then with one.
  const approver = await as('approver');
  await approver.getByRole('link', { name: 'My work' }).click();
  await approver.getByRole('link', { name: LABEL }).click();
  await approver.getByLabel('Return for rework').check();
  await sign(approver, 'Return for rework', '', PEOPLE.approver.password);
  await expect(
    approver.getByText('Say why the plate is returned; the biologist reworks it from your comment.'),
  ).toBeVisible();
  await shot(approver, 'signoff-2-approver-return-needs-comment');
  await approver.getByLabel('Return for rework').check();
  await sign(
    approver,
    'Return for rework',
    'Vehicle wells in column 1 drift; re-check the exclusions.',
    PEOPLE.approver.password,
  );
  await signed(approver, 'returned for rework');
  const [returned] = await mailTo('biologist', 'returned for rework');
  expect(returned!.text).toContain('Comment: Vehicle wells in column 1 drift; re-check the exclusions.');

  // Rework: the biologist reopens it, the chemist verifies again, the biologist submits again.
  await open('biologist');
  await sign(biologist, 'Reopen for rework', 'Exclusions re-checked.', PEOPLE.biologist.password);
  await signed(biologist, 'imported');
  await mailTo('chemist', 'reopened');
  await open('chemist');
  await sign(chemist, 'Verify the compound map', '', PEOPLE.chemist.password);
  await signed(chemist, 'verified');
  await open('biologist');
  await sign(biologist, 'Submit for approval', '', PEOPLE.biologist.password);
  await signed(biologist, 'submitted');
  await mailTo('approver2', 'submitted for approval', 2);

  // The other approver approves, after one wrong password.
  const approver2 = await open('approver2');
  await sign(approver2, 'Approve', '', 'not-the-password');
  await expect(
    approver2.getByRole('form', { name: 'Sign this step' }).getByText('That password is not right.'),
  ).toBeVisible();
  await sign(approver2, 'Approve', 'Accepted.', PEOPLE.approver2.password);
  await signed(approver2, 'approved');
  await mailTo('biologist', 'approved and locked');
  await expect(
    approver2.getByText('Approved and locked: wells, exclusions, readouts and fits can no longer change.'),
  ).toBeVisible();
  await expect(approver2.getByRole('button', { name: /^Sign:/ })).toHaveCount(0);
  const history = approver2.getByRole('region', { name: 'History' });
  for (const title of [
    'Imported',
    'Returned for rework',
    'Reopened for rework',
    'Signature refused',
    'Approved',
  ]) {
    await expect(history.getByText(title, { exact: true }).first()).toBeVisible();
  }
  await shot(approver2, 'signoff-3-approved-history');
  expect(
    await dbRow<{ n: number }>('select count(*)::int as n from signoff_events where plate_id = $1', [
      plateId,
    ]),
  ).toEqual({ n: 7 });

  // The admin sees every notification and its delivery in the outbox.
  const admin = await as('admin');
  await admin.goto('/admin/outbox');
  await expect(admin.getByRole('heading', { name: 'Mail outbox' })).toBeVisible();
  await expect(
    admin.getByRole('link', { name: `Gatewell: plate ${LABEL} approved and locked` }).first(),
  ).toBeVisible();
  await expect(admin.getByText('Sent', { exact: true }).first()).toBeVisible();
  await shot(admin, 'signoff-4-admin-outbox');
});

test('a plate below its Z′ limit warns beside the sign button and needs the acknowledgement', async ({
  browser,
}) => {
  // NAV-P03 is the noisy demo plate the demo signed through to submitted (scripts/seed-demo.ts).
  const plate = await dbRow<{ id: string; state: string }>('select id, state from plates where label = $1', [
    'NAV-P03',
  ]);
  expect(plate?.state).toBe('submitted');
  const approver = await signedIn(browser, 'approver');
  await approver.goto(`/plates/${plate!.id}/history`);
  const form = approver.getByRole('form', { name: 'Sign this step' });
  await expect(form.getByRole('note')).toContainText(/QC warning/);
  await expect(form.getByRole('note')).toContainText(/Z′ 0\.\d\d is below the screen's limit of 0\.5/);
  await approver.getByLabel('Your password, to sign').fill(PEOPLE.approver.password);
  await approver.getByRole('button', { name: 'Sign: Approve' }).click();
  await expect(
    form.getByText(/tick that you read (it|them) before you sign\. Nothing was signed\./).first(),
  ).toBeVisible();
  // The history shows what the verifier and the submitter acknowledged with their signatures.
  await expect(
    approver.getByRole('region', { name: 'History' }).getByText('QC warnings acknowledged when signing:'),
  ).toHaveCount(2);
  await shot(approver, 'signoff-5-qc-warning-needs-acknowledgement');
  expect(await dbRow<{ state: string }>('select state from plates where id = $1', [plate!.id])).toEqual({
    state: 'submitted',
  });
  // What the submitter acknowledged is kept with the submit signature.
  const submitted = await dbRow<{ codes: string[] }>(
    `select array(select jsonb_array_elements(qc_warnings) ->> 'code') as codes from signoff_events where plate_id = $1 and to_state = 'submitted'`,
    [plate!.id],
  );
  expect(submitted!.codes).toContain('z_prime_below_limit');
});
