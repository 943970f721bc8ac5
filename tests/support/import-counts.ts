import { AuditEvent, Fit, ImportTemplate, Plate, Readout, UploadedFile, Well } from '@/models';

/** Row counts of everything an import writes, to show that a refused import wrote nothing. */
export async function importRowCounts(): Promise<number[]> {
  return [
    await Plate.count(),
    await Well.count(),
    await Readout.count(),
    await Fit.count(),
    await UploadedFile.count(),
    await ImportTemplate.count(),
    await AuditEvent.count({ where: { action: 'import' } }),
  ];
}
