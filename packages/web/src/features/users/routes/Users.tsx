import { Button, H1, HTMLSelect, InputGroup, Intent, Spinner, Tag } from '@blueprintjs/core';
import { Cell, Column, Table2 } from '@blueprintjs/table';
import { useDeferredValue, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { EmptyState, Notice } from '../../../components/Notice';
import { formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { RequireRole } from '../../../components/RequireRole';
import { type Role, roleValues, type UserStatus } from '../../../lib/api/types';
import { roleLabels } from '../../../lib/roles';
import { useMe } from '../../../lib/session';
import type { User } from '../../../lib/api/types';
import { type UserFilters, useUserOptions, useUsers } from '../api/users';
import { AddUserDialog } from '../components/AddUserDialog';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { UserDrawer } from '../components/UserDrawer';
import './Users.css';

/** `/users`: the regional lead's list of people, their roles and practices. */
export function Users() {
  usePageTitle('Users');
  return (
    <RequireRole roles={['regional_lead']}>
      <UsersScreen />
    </RequireRole>
  );
}

const ROW_HEIGHT = 32;

function UsersScreen() {
  const me = useMe();
  const [params, setParams] = useSearchParams();
  const [search, setSearch] = useState(params.get('search') ?? '');
  const deferredSearch = useDeferredValue(search);
  const filters: UserFilters = {
    search: deferredSearch,
    role: (params.get('role') ?? '') as Role | '',
    status: (params.get('status') ?? '') as UserStatus | '',
    practiceId: params.get('practiceId') ? Number(params.get('practiceId')) : '',
  };
  const users = useUsers(filters);
  const options = useUserOptions();
  const [openId, setOpenId] = useState<number | null>(null);
  const [adding, setAdding] = useState(false);

  const setFilter = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };

  const list = users.data?.users ?? [];
  const open = list.find((u) => u.id === openId) ?? null;
  const practices = options.data?.practices ?? [];

  const text = (row: number, value: (u: User) => string) => (
    <Cell>{list[row] ? value(list[row]) : ''}</Cell>
  );

  return (
    <div className="cairn-users">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Users</H1>
          <p className="cairn-muted">
            Who can sign in to Cairn, in which role, and which practices each practice lead leads.
          </p>
        </div>
        <Button intent={Intent.PRIMARY} icon="new-person" onClick={() => setAdding(true)}>
          Add person
        </Button>
      </div>

      {users.data?.trustIdpRoles ? (
        <Notice intent={Intent.WARNING} icon="info-sign" className="cairn-users-callout">
          Cairn takes roles and practices from your organisation&apos;s sign-in. Changes made here
          last until the person next signs in; make lasting changes in your organisation&apos;s
          directory.
        </Notice>
      ) : null}

      <div className="cairn-filters" role="search">
        <InputGroup
          leftIcon="search"
          placeholder="Search name or e-mail"
          aria-label="Search name or e-mail"
          value={search}
          onValueChange={(value) => {
            setSearch(value);
            setFilter('search', value.trim());
          }}
        />
        <HTMLSelect
          aria-label="Role"
          value={filters.role}
          onChange={(e) => setFilter('role', e.currentTarget.value)}
        >
          <option value="">All roles</option>
          {roleValues.map((r) => (
            <option key={r} value={r}>
              {roleLabels[r]}s
            </option>
          ))}
        </HTMLSelect>
        <HTMLSelect
          aria-label="Status"
          value={filters.status}
          onChange={(e) => setFilter('status', e.currentTarget.value)}
        >
          <option value="">Active and deactivated</option>
          <option value="active">Active</option>
          <option value="deactivated">Deactivated</option>
        </HTMLSelect>
        <HTMLSelect
          aria-label="Practice"
          value={filters.practiceId === '' ? '' : String(filters.practiceId)}
          onChange={(e) => setFilter('practiceId', e.currentTarget.value)}
        >
          <option value="">All practices</option>
          {practices.map((p) => (
            <option key={p.id} value={p.id}>
              {p.code} · {p.name}
            </option>
          ))}
        </HTMLSelect>
        <span className="cairn-muted cairn-count" aria-live="polite">
          {users.data ? `${list.length} ${list.length === 1 ? 'person' : 'people'}` : ''}
        </span>
      </div>

      <ProblemCallout error={users.error} />
      {users.isPending ? (
        <Spinner aria-label="Loading people" />
      ) : list.length === 0 ? (
        <EmptyState
          icon="people"
          title="Nobody matches"
          description="Change the search or the filters."
        />
      ) : (
        <div
          className="cairn-users-table"
          style={{ height: Math.min(list.length, 14) * ROW_HEIGHT + 34 }}
        >
          <Table2
            numRows={list.length}
            defaultRowHeight={ROW_HEIGHT}
            enableRowHeader={false}
            enableRowResizing={false}
            columnWidths={[190, 270, 120, 230, 140, 160, 80]}
            cellRendererDependencies={[list]}
          >
            <Column name="Name" cellRenderer={(row) => text(row, (u) => u.displayName)} />
            <Column name="E-mail" cellRenderer={(row) => text(row, (u) => u.email)} />
            <Column name="Role" cellRenderer={(row) => text(row, (u) => roleLabels[u.role])} />
            <Column
              name="Practices"
              cellRenderer={(row) =>
                text(row, (u) =>
                  u.role === 'practice_lead'
                    ? u.practices.map((p) => p.code).join(', ') || 'none yet'
                    : 'all (region-wide)',
                )
              }
            />
            <Column
              name="Status"
              cellRenderer={(row) => (
                <Cell>
                  {list[row]?.status === 'deactivated' ? (
                    <Tag minimal intent={Intent.DANGER} icon="disable">
                      Deactivated
                    </Tag>
                  ) : (
                    'Active'
                  )}
                </Cell>
              )}
            />
            <Column
              name="Last sign-in"
              cellRenderer={(row) =>
                text(row, (u) => (u.lastSignInAt ? formatDateTime(u.lastSignInAt) : 'never'))
              }
            />
            <Column
              name=""
              cellRenderer={(row) => (
                <Cell interactive>
                  <Button
                    size="small"
                    variant="minimal"
                    icon="edit"
                    aria-label={`Edit ${list[row]?.displayName ?? ''}`}
                    onClick={() => setOpenId(list[row]?.id ?? null)}
                  >
                    Edit
                  </Button>
                </Cell>
              )}
            />
          </Table2>
        </div>
      )}

      <UserDrawer
        user={open}
        practices={practices}
        selfId={me.data?.id ?? 0}
        trustIdpRoles={users.data?.trustIdpRoles ?? false}
        onClose={() => setOpenId(null)}
      />
      <AddUserDialog
        isOpen={adding}
        practices={practices}
        onClose={() => setAdding(false)}
        onCreated={(user) => {
          setAdding(false);
          setOpenId(user.id);
        }}
      />
    </div>
  );
}
