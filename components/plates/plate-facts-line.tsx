import { PLATE_FACTS, PLATE_FACT_LABEL } from '@/lib/imports/import-fields';

/** The plate facts the file gave outside its table (barcode, run date, cell line, temperature, operator). */
export function PlateFactsLine({ facts }: { facts: Record<string, string> }) {
  const shown = PLATE_FACTS.filter((fact) => facts[fact]);
  if (shown.length === 0) return null;
  return (
    <dl
      className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-700"
      aria-label="Plate facts from the file"
    >
      {shown.map((fact) => (
        <div key={fact} className="flex gap-1">
          <dt className="text-ink-500">{PLATE_FACT_LABEL[fact]}:</dt>
          <dd className={fact === 'barcode' ? 'font-mono' : undefined}>{facts[fact]}</dd>
        </div>
      ))}
    </dl>
  );
}
