/** A table's column headings; a `false` entry is a column this viewer does not get. */
export function TableHead({ columns }: { columns: (string | false)[] }) {
  return (
    <thead>
      <tr>
        {columns
          .filter((c): c is string => c !== false)
          .map((c) => (
            <th key={c} scope="col">
              {c}
            </th>
          ))}
      </tr>
    </thead>
  );
}
