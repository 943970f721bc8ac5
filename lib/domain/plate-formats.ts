// Plate formats: wells per plate, and the rows and columns of each.

/** Wells per plate, smallest first. */
export const PLATE_FORMATS = [96, 384, 1536] as const;
export type PlateFormat = (typeof PLATE_FORMATS)[number];

/** Rows and columns of each format: 96 = 8 × 12, 384 = 16 × 24, 1536 = 32 × 48. */
export const PLATE_FORMAT_SIZE: Record<PlateFormat, { rows: number; columns: number }> = {
  96: { rows: 8, columns: 12 },
  384: { rows: 16, columns: 24 },
  1536: { rows: 32, columns: 48 },
};
