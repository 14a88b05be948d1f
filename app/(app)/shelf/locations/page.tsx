import Link from 'next/link';
import { db } from '@/db';
import { requirePageUser } from '@/lib/auth/guard';
import { isStaff } from '@/lib/auth/roles';
import { listLocations } from '@/lib/inventory/locations';
import { PageTitle } from '@/components/ui/page-title';
import { CodeText } from '@/components/shelf/code-text';
import { LocationActions, NewLocationForm } from '@/components/shelf/location-forms';
import { ScrollRegion } from '@/components/shelf/scroll-region';
import { TableHead } from '@/components/shelf/table-head';

export const metadata = { title: 'Locations' };

export default async function LocationsPage() {
  const ctx = await requirePageUser();
  const staff = isStaff(ctx);
  const locations = await listLocations(db, ctx);
  return (
    <div className="space-y-4">
      <PageTitle
        title="Locations"
        lead="Bins, shelves and drawers. Each has a label code, so scanning a bin opens what is in it."
      />
      {staff ? <NewLocationForm /> : null}
      <ScrollRegion label="Locations">
        <table className="table-dense">
          <TableHead columns={['Name', 'Kind', 'Code', 'Parts stocked', 'Units', staff && 'Change']} />
          <tbody>
            {locations.map((l) => (
              <tr key={l.id}>
                <td>
                  <Link href={`/shelf/locations/${l.id}`}>{l.name}</Link>
                </td>
                <td>{l.kind}</td>
                <td>
                  <CodeText code={l.code} />
                </td>
                <td className="tabular-nums">{l.partsStocked}</td>
                <td className="tabular-nums">{l.units}</td>
                {staff ? (
                  <td>
                    <LocationActions id={l.id} name={l.name} />
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollRegion>
    </div>
  );
}
