import { useMemo, useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@shared/schema/roles';
import { api, ApiError } from '../../../lib/api-client';
import { DataTable, type TableColumns } from '../../../components/ui/data-table';
import { Alert, Card, PageHeader, Spinner, Badge } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { shopKeys, shopQueries, type MemberRow } from '../api/queries';
import { RolePicker, ROLE_LABELS } from './role-picker';
import { InviteForm } from './invite-form';
import { useFormat } from '../../../lib/format';

function RolesCell({ member }: { member: MemberRow }) {
  const qc = useQueryClient();
  const [editing, setEditing] = useState(false);
  const [roles, setRoles] = useState<Role[]>(member.roles);
  const save = useMutation({
    mutationFn: (next: Role[]) => api.patch(`/api/shop/members/${member.id}`, { roles: next }),
    onSuccess: () => { setEditing(false); void qc.invalidateQueries({ queryKey: shopKeys.members() }); },
  });
  if (!editing) {
    return (
      <div className="flex flex-wrap items-center gap-2">
        {member.roles.map((r) => <Badge key={r}>{ROLE_LABELS[r]}</Badge>)}
        <Button variant="ghost" onClick={() => setEditing(true)} aria-label={`Change roles of ${member.name}`}>Change</Button>
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-2">
      <RolePicker value={roles} onChange={setRoles} legend={`Roles of ${member.name}`} />
      {save.error && <Alert>{save.error instanceof ApiError ? save.error.message : 'Not saved.'}</Alert>}
      <div className="flex gap-2">
        <Button onClick={() => save.mutate(roles)} busy={save.isPending} disabled={roles.length === 0}>Save roles</Button>
        <Button variant="ghost" onClick={() => { setRoles(member.roles); setEditing(false); }}>Cancel</Button>
      </div>
    </div>
  );
}

/** Disabling ends the member's sessions in this shop at once; enabling lets them back in with their roles. */
function AccessCell({ member }: { member: MemberRow }) {
  const qc = useQueryClient();
  const toggle = useMutation({
    mutationFn: () => api.post(`/api/shop/members/${member.id}/${member.disabled ? 'enable' : 'disable'}`),
    onSuccess: () => void qc.invalidateQueries({ queryKey: shopKeys.members() }),
  });
  return (
    <div className="flex flex-wrap items-center gap-2">
      <Badge tone={member.disabled ? 'neutral' : 'go'}>{member.disabled ? 'Disabled' : 'Active'}</Badge>
      <Button variant="ghost" onClick={() => toggle.mutate()} busy={toggle.isPending}
        aria-label={`${member.disabled ? 'Enable' : 'Disable'} ${member.name}`}>{member.disabled ? 'Enable' : 'Disable'}</Button>
      {toggle.error && <Alert>{toggle.error instanceof ApiError ? toggle.error.message : 'Not changed.'}</Alert>}
    </div>
  );
}

export function MembersPage() {
  const members = useQuery(shopQueries.members());
  const invitations = useQuery(shopQueries.invitations());
  const fmt = useFormat();
  const columns = useMemo<TableColumns<MemberRow>>(() => [
    { accessorKey: 'name', header: 'Name' },
    { accessorKey: 'email', header: 'E-mail' },
    { id: 'roles', accessorFn: (m) => m.roles.join(' '), header: 'Roles', cell: (info) => <RolesCell member={info.row.original} /> },
    { accessorKey: 'since', header: 'Member since', cell: (info) => fmt.date(info.getValue() as string) },
    { id: 'access', accessorFn: (m) => (m.disabled ? 'disabled' : 'active'), header: 'Access', cell: (info) => <AccessCell member={info.row.original} /> },
  ], [fmt]);
  return (
    <div className="grid gap-6 xl:grid-cols-[1fr_380px]">
      <section>
        <PageHeader title="Members" subtitle="Who works in this shop, and what each may do. Disabling a member signs them out of this shop at once." />
        {members.isLoading ? <Spinner /> : members.error ? <Alert>{(members.error as Error).message}</Alert> : (
          <DataTable data={members.data ?? []} columns={columns} label="Members" filterPlaceholder="Filter by name, e-mail or role" />
        )}
      </section>
      <aside className="flex flex-col gap-4">
        <Card>
          <h2 className="mb-3 text-xl">Invite someone</h2>
          <InviteForm />
        </Card>
        <Card>
          <h2 className="mb-3 text-xl">Invitations</h2>
          {invitations.data?.length ? (
            <ul className="flex flex-col divide-y divide-line">
              {invitations.data.map((i) => (
                <li key={i.id} className="py-2">
                  <p className="font-semibold">{i.email}</p>
                  <p className="text-sm text-ink-soft">{i.roles.map((r) => ROLE_LABELS[r]).join(', ')} · <Badge tone={i.state === 'open' ? 'signal' : i.state === 'accepted' ? 'go' : 'neutral'}>{i.state}</Badge></p>
                  <p className="text-sm text-ink-soft">Sent {fmt.date(i.createdAt)}{i.state === 'open' ? ` · open until ${fmt.dateTime(i.expiresAt)}` : ''}</p>
                </li>
              ))}
            </ul>
          ) : <p className="text-ink-soft">No invitations yet.</p>}
        </Card>
      </aside>
    </div>
  );
}
