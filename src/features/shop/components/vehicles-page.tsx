import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { VehicleDto } from '@shared/schema/vehicle';
import { DataTable, type TableColumns } from '../../../components/ui/data-table';
import { Alert, Card, PageHeader, Spinner } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { shopQueries } from '../api/queries';
import { VehicleForm } from './vehicle-form';

export function VehiclesPage() {
  const vehicles = useQuery(shopQueries.vehicles());
  const [editing, setEditing] = useState<VehicleDto | 'new' | null>(null);
  const columns = useMemo<TableColumns<VehicleDto>>(() => [
    { accessorKey: 'label', header: 'Label' },
    { accessorKey: 'model', header: 'Model' },
    { accessorKey: 'frameNumber', header: 'Frame number / VIN' },
    { accessorKey: 'hours', header: 'Hours', cell: (i) => (i.getValue() === null ? '—' : String(i.getValue())) },
    {
      id: 'edit', header: () => <span className="sr-only">Edit</span>, enableSorting: false,
      cell: (i) => <Button variant="ghost" onClick={() => setEditing(i.row.original)} aria-label={`Edit ${i.row.original.label}`}>Edit</Button>,
    },
  ], []);
  return (
    <div className="flex flex-col gap-4">
      <PageHeader title="Machines" subtitle="The fleet this shop services." actions={<Button onClick={() => setEditing('new')}>Add a machine</Button>} />
      {editing && (
        <Card>
          <h2 className="mb-3 text-xl">{editing === 'new' ? 'New machine' : `Edit ${editing.label}`}</h2>
          <VehicleForm key={editing === 'new' ? 'new' : editing.id} vehicle={editing === 'new' ? undefined : editing} onDone={() => setEditing(null)} />
        </Card>
      )}
      {vehicles.isLoading ? <Spinner /> : vehicles.error ? <Alert>{(vehicles.error as Error).message}</Alert> : (
        <DataTable data={vehicles.data ?? []} columns={columns} label="Machines" filterPlaceholder="Search label, model or frame number" />
      )}
    </div>
  );
}
