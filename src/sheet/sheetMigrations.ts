// Migrations from older sheet file versions, each a pure function from one version's data to the
// next. Version 0 was the draft format: cells had `display` (display unit) and `comment` (note),
// and the sheet text was `description`.

export type Migration = (data: Record<string, unknown>) => Record<string, unknown>;

/** Version 0 -> 1: display -> unit, comment -> note, description -> notes. */
export const migrate0to1: Migration = (data) => {
  const cells = data.cells;
  const out: Record<string, unknown> = { format: data.format, version: 1 };
  if (data.title !== undefined) out.title = data.title;
  if (data.description !== undefined) out.notes = data.description;
  out.cells = Array.isArray(cells)
    ? cells.map((c: unknown) => {
        if (typeof c !== 'object' || c === null || Array.isArray(c)) return c;
        const { display, comment, ...rest } = c as Record<string, unknown>;
        const cell: Record<string, unknown> = { ...rest };
        if (display !== undefined) cell.unit = display;
        if (comment !== undefined) cell.note = comment;
        return cell;
      })
    : cells;
  return out;
};

/** Version 1 -> 2: cells may carry a "prior"; nothing in a version-1 file changes. */
export const migrate1to2: Migration = (data) => ({ ...data, version: 2 });

/** Migrations by the version they start from. */
export const MIGRATIONS: ReadonlyArray<Migration> = [migrate0to1, migrate1to2];

/** Applies the migrations from `version` up to the current version. */
export function migrateToCurrent(data: Record<string, unknown>, version: number): Record<string, unknown> {
  let d = data;
  for (let v = version; v < MIGRATIONS.length; v++) d = MIGRATIONS[v](d);
  return d;
}

/** Fields renamed by a migration, by the version that still used the old name: new name -> old name. */
const RENAMED_FIELDS: Record<number, { file: Record<string, string>; cell: Record<string, string> }> = {
  0: { file: { notes: 'description' }, cell: { unit: 'display', note: 'comment' } },
};

/** The name a field of the current version had in file version `version` (for messages about that file). */
export function fieldNameInVersion(field: string, version: number, where: 'file' | 'cell'): string {
  let name = field;
  for (let v = MIGRATIONS.length - 1; v >= version; v--) name = RENAMED_FIELDS[v]?.[where][name] ?? name;
  return name;
}
