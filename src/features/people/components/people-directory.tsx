import type { ColumnDef, SortingState } from '@tanstack/react-table';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import type { PeopleQuery, PeopleSortColumn, Person } from '../../../../server/schemas/people';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { SelectField, TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { PagedTable } from '../../../components/ui/paged-table';
import { peopleSearch, usePeople } from '../api/list-people';
import { useSetPersonActive } from '../api/set-person-active';
import { ErasePerson } from './erase-person';
import { PersonForm } from './person-form';

type Panel = { mode: 'add' } | { mode: 'edit' | 'erase'; person: Person } | null;
type Status = 'active' | 'inactive' | 'all';
type Booking = 'any' | 'booked' | 'not_booked';

/** The client's people: server-side search, filters, sorting and paging; export; hand edits. */
export function PeopleDirectory({
  clientId,
  offices,
}: {
  clientId: string;
  offices: Array<{ id: string; name: string }>;
}) {
  const [search, setSearch] = useState('');
  const [officeId, setOfficeId] = useState('');
  const [department, setDepartment] = useState('');
  const [status, setStatus] = useState<Status>('active');
  const [booking, setBooking] = useState<Booking>('any');
  const [page, setPage] = useState({ page: 1, pageSize: 25 });
  const [sorting, setSorting] = useState<SortingState>([{ id: 'name', desc: false }]);
  const [panel, setPanel] = useState<Panel>(null);
  const [message, setMessage] = useState<string | null>(null);
  const setActive = useSetPersonActive();
  // The form opens above the table: bring it into view, wherever the row was on the page.
  const panelRef = useRef<HTMLElement>(null);
  useEffect(() => {
    if (!panel) return;
    panelRef.current?.scrollIntoView({ block: 'start' });
    panelRef.current?.querySelector<HTMLElement>('input, select, textarea, button')?.focus();
  }, [panel]);

  const filters = { q: search, officeId, department, status, booking };
  const query: PeopleQuery = {
    ...filters,
    sort: (sorting[0]?.id as PeopleSortColumn | undefined) ?? 'name',
    direction: sorting[0]?.desc ? 'desc' : 'asc',
    ...page,
  };
  const people = usePeople(clientId, query);
  const filtering = (apply: () => void) => {
    apply();
    setPage((current) => ({ ...current, page: 1 }));
  };

  // Each sortable column has an accessor: TanStack Table offers sorting only on those. The
  // order itself comes from the server (manual sorting), by the column id.
  const columns = useMemo<ColumnDef<Person, unknown>[]>(
    () => [
      {
        id: 'name',
        header: 'Name',
        accessorFn: (p) => `${p.familyName} ${p.givenName}`,
        cell: ({ row: { original: p } }) => (
          <span className="font-medium">
            {p.givenName} {p.familyName}
            {p.preferredName ? (
              <span className="font-normal text-ink-muted"> ({p.preferredName})</span>
            ) : null}
          </span>
        ),
      },
      {
        id: 'actions',
        header: 'Actions',
        enableSorting: false,
        cell: ({ row: { original: p } }) => {
          const name = `${p.givenName} ${p.familyName}`;
          return (
            <div className="flex gap-1">
              <Button
                variant="quiet"
                aria-label={`Edit ${name}`}
                onClick={() => {
                  setMessage(null);
                  setPanel({ mode: 'edit', person: p });
                }}
              >
                Edit
              </Button>
              <Button
                variant="quiet"
                aria-label={`${p.active ? 'Deactivate' : 'Reactivate'} ${name}`}
                onClick={() =>
                  setActive.mutate(
                    { clientId, personId: p.id, active: !p.active },
                    {
                      onSuccess: () =>
                        setMessage(
                          p.active
                            ? `${name} is inactive now: listed under Status “Inactive” or “Everyone”, bookings and photos kept. Reactivate there to undo.`
                            : `${name} is active again.`,
                        ),
                    },
                  )
                }
              >
                {p.active ? 'Deactivate' : 'Reactivate'}
              </Button>
              <Button
                variant="quiet"
                aria-label={`Erase ${name}`}
                onClick={() => setPanel({ mode: 'erase', person: p })}
              >
                Erase
              </Button>
            </div>
          );
        },
      },
      {
        id: 'email',
        header: 'Work e-mail',
        accessorFn: (p) => p.email,
        cell: ({ row }) => row.original.email,
      },
      {
        id: 'employeeId',
        header: 'Employee id',
        accessorFn: (p) => p.employeeId,
        cell: ({ row }) => row.original.employeeId ?? '—',
      },
      {
        id: 'department',
        header: 'Department',
        accessorFn: (p) => p.department,
        cell: ({ row }) => row.original.department ?? '—',
      },
      {
        id: 'jobTitle',
        header: 'Job title',
        accessorFn: (p) => p.jobTitle,
        cell: ({ row }) => row.original.jobTitle ?? '—',
      },
      {
        id: 'office',
        header: 'Office',
        accessorFn: (p) => p.officeName,
        cell: ({ row }) => row.original.officeName ?? '—',
      },
      {
        id: 'active',
        header: 'Status',
        accessorFn: (p) => p.active,
        cell: ({ row }) =>
          row.original.active ? 'Active' : <span className="text-caution-600">Inactive</span>,
      },
      {
        id: 'booked',
        header: 'Booking',
        enableSorting: false,
        cell: ({ row }) => (row.original.booked ? 'Booked' : 'Not booked'),
      },
    ],
    [clientId, setActive],
  );

  const data = people.data;
  const nobodyYet =
    data &&
    data.total === 0 &&
    !search &&
    !officeId &&
    !department &&
    status === 'active' &&
    booking === 'any';

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap gap-3">
        <Button onClick={() => setPanel({ mode: 'add' })}>Add a person</Button>
        <Link
          to={`/clients/${clientId}/people/import`}
          className="inline-flex min-h-touch items-center rounded-control border border-line-strong bg-paper-raised px-4 font-medium text-spruce-700 hover:bg-spruce-50"
        >
          Import a staff list (CSV)
        </Link>
        <a
          href={`/api/clients/${clientId}/people/export.csv?${peopleSearch(filters)}`}
          download
          className="inline-flex min-h-touch items-center rounded-control px-4 font-medium text-spruce-700 underline-offset-4 hover:underline"
        >
          Export these people (CSV)
        </a>
      </div>
      {message ? <Notice tone="success">{message}</Notice> : null}
      {setActive.isError ? <Notice tone="danger">{setActive.error.message}</Notice> : null}
      {panel ? (
        <Card
          ref={panelRef}
          title={
            panel.mode === 'add'
              ? 'Add a person'
              : panel.mode === 'edit'
                ? 'Edit a person'
                : 'Erase a person'
          }
        >
          {panel.mode === 'erase' ? (
            <ErasePerson
              clientId={clientId}
              person={panel.person}
              onDone={(erased) => {
                setPanel(null);
                setMessage(erased ? 'The person was erased.' : null);
              }}
            />
          ) : (
            <PersonForm
              key={panel.mode === 'edit' ? panel.person.id : 'new'}
              clientId={clientId}
              person={panel.mode === 'edit' ? panel.person : null}
              offices={offices}
              onDone={() => setPanel(null)}
            />
          )}
        </Card>
      ) : null}
      <div role="search" className="grid gap-4 sm:grid-cols-2 lg:grid-cols-5">
        <TextField
          label="Search by name, e-mail or id"
          type="search"
          value={search}
          onChange={(value) => filtering(() => setSearch(value))}
        />
        <SelectField
          label="Office"
          value={officeId}
          onChange={(value) => filtering(() => setOfficeId(value))}
          options={[
            { value: '', label: 'All offices' },
            ...offices.map((office) => ({ value: office.id, label: office.name })),
          ]}
        />
        <SelectField
          label="Department"
          value={department}
          onChange={(value) => filtering(() => setDepartment(value))}
          options={[
            { value: '', label: 'All departments' },
            ...(data?.departments ?? []).map((name) => ({ value: name, label: name })),
          ]}
        />
        <SelectField
          label="Status"
          value={status}
          onChange={(value) => filtering(() => setStatus(value as Status))}
          options={[
            { value: 'active', label: 'Active' },
            { value: 'inactive', label: 'Inactive' },
            { value: 'all', label: 'Everyone' },
          ]}
        />
        <SelectField
          label="Booking"
          value={booking}
          onChange={(value) => filtering(() => setBooking(value as Booking))}
          options={[
            { value: 'any', label: 'Booked or not' },
            { value: 'booked', label: 'Has booked a slot' },
            { value: 'not_booked', label: 'Has not booked' },
          ]}
        />
      </div>
      {people.isError ? <Notice tone="danger">{people.error.message}</Notice> : null}
      {nobodyYet ? (
        <EmptyState title="Nobody is on the roster yet">
          Import the staff list your HR system exports (CSV), or add people one by one.
        </EmptyState>
      ) : (
        <PagedTable
          caption="People"
          columns={columns}
          rows={data?.people ?? []}
          total={data?.total ?? 0}
          page={page}
          onPageChange={setPage}
          sorting={sorting}
          onSortingChange={(next) => {
            setSorting(next);
            setPage((current) => ({ ...current, page: 1 }));
          }}
          busy={people.isFetching}
          rowKey={(person) => person.id}
          dense
        />
      )}
    </div>
  );
}
