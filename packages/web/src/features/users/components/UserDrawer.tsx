import {
  Alert,
  Button,
  ControlGroup,
  Drawer,
  FormGroup,
  H3,
  HTMLSelect,
  InputGroup,
  Intent,
  Tag,
} from '@blueprintjs/core';
import { useEffect, useState } from 'react';
import { formatDateTime } from '../../../lib/format';
import { type Role, roleValues } from '../../../lib/api/types';
import { roleLabels } from '../../../lib/roles';
import type { Practice, User } from '../../../lib/api/types';
import { type UserChange, useChangeUser } from '../api/users';
import { PracticePicker } from './PracticePicker';
import { Notice } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';

interface Props {
  user: User | null;
  practices: Practice[];
  /** The signed-in regional lead's own id: they cannot change their own role or access */
  selfId: number;
  trustIdpRoles: boolean;
  onClose: () => void;
}

type Confirm = { kind: 'role'; role: Role } | { kind: 'deactivate' } | null;

/** Everything the regional lead can change about one person. */
export function UserDrawer({ user, practices, selfId, trustIdpRoles, onClose }: Props) {
  const change = useChangeUser();
  const [name, setName] = useState('');
  const [role, setRole] = useState<Role>('practice_lead');
  const [confirm, setConfirm] = useState<Confirm>(null);
  const [done, setDone] = useState<string | null>(null);

  useEffect(() => {
    setName(user?.displayName ?? '');
    setRole(user?.role ?? 'practice_lead');
    setDone(null);
    change.reset();
    // Reset the form when another person is opened, not on every refresh of the same one.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [user?.id]);

  if (!user) return <Drawer isOpen={false} onClose={onClose} />;
  const self = user.id === selfId;
  const run = (c: UserChange, message: string) => {
    setDone(null);
    change.mutate(c, { onSuccess: () => setDone(message) });
  };

  return (
    <Drawer
      isOpen
      onClose={onClose}
      size="480px"
      title={user.displayName}
      icon="person"
      className="cairn-user-drawer"
    >
      <div className="cairn-user-drawer-body">
        <p className="cairn-muted">
          {user.email}
          <br />
          Last sign-in: {user.lastSignInAt ? formatDateTime(user.lastSignInAt) : 'never'}
        </p>
        {trustIdpRoles ? (
          <Notice intent={Intent.WARNING} icon="info-sign">
            Roles and practices come from your organisation&apos;s sign-in: changes here last until
            this person next signs in.
          </Notice>
        ) : null}
        {done ? (
          <Notice intent={Intent.SUCCESS} icon="tick">
            {done}
          </Notice>
        ) : null}
        <ProblemCallout error={change.error} />

        <section aria-labelledby="drawer-name">
          <H3 id="drawer-name">Name</H3>
          <ControlGroup fill>
            <InputGroup aria-label="Name" value={name} onValueChange={setName} />
            <Button
              disabled={!name.trim() || name.trim() === user.displayName || change.isPending}
              onClick={() =>
                run(
                  { kind: 'update', userId: user.id, changes: { displayName: name.trim() } },
                  'Name saved.',
                )
              }
            >
              Save
            </Button>
          </ControlGroup>
        </section>

        <section aria-labelledby="drawer-role">
          <H3 id="drawer-role">Role</H3>
          <FormGroup
            helperText={
              self
                ? 'You cannot change your own role; another regional lead can.'
                : user.role === 'practice_lead'
                  ? 'Changing the role removes their practices.'
                  : undefined
            }
          >
            <ControlGroup fill>
              <HTMLSelect
                aria-label="Role"
                value={role}
                disabled={self}
                onChange={(e) => setRole(e.currentTarget.value as Role)}
              >
                {roleValues.map((r) => (
                  <option key={r} value={r}>
                    {roleLabels[r]}
                  </option>
                ))}
              </HTMLSelect>
              <Button
                disabled={self || role === user.role || change.isPending}
                onClick={() => setConfirm({ kind: 'role', role })}
              >
                Change role
              </Button>
            </ControlGroup>
          </FormGroup>
        </section>

        {user.role === 'practice_lead' ? (
          <section aria-labelledby="drawer-practices">
            <H3 id="drawer-practices">Practices</H3>
            <PracticePicker
              label="Practice to add"
              value={user.practices}
              options={practices}
              disabled={change.isPending}
              onAdd={(practiceId) => {
                const p = practices.find((x) => x.id === practiceId);
                run(
                  { kind: 'assign', userId: user.id, practiceId },
                  `${p?.code ?? 'Practice'} added.`,
                );
              }}
              onRemove={(practiceId) => {
                const p = user.practices.find((x) => x.id === practiceId);
                run(
                  { kind: 'remove', userId: user.id, practiceId },
                  `${p?.code ?? 'Practice'} removed.`,
                );
              }}
            />
          </section>
        ) : null}

        <section aria-labelledby="drawer-access">
          <H3 id="drawer-access">Access</H3>
          <p>
            {user.status === 'active' ? (
              <Tag intent={Intent.SUCCESS} icon="tick" minimal>
                Active
              </Tag>
            ) : (
              <Tag intent={Intent.DANGER} icon="disable" minimal>
                Deactivated
              </Tag>
            )}
          </p>
          {user.status === 'active' ? (
            <Button
              intent={Intent.DANGER}
              icon="disable"
              disabled={self || change.isPending}
              title={self ? 'You cannot deactivate yourself' : undefined}
              onClick={() => setConfirm({ kind: 'deactivate' })}
            >
              Deactivate
            </Button>
          ) : (
            <Button
              icon="unlock"
              disabled={change.isPending}
              onClick={() =>
                run(
                  { kind: 'reactivate', userId: user.id },
                  `${user.displayName} can sign in again.`,
                )
              }
            >
              Reactivate
            </Button>
          )}
        </section>
      </div>

      <Alert
        isOpen={confirm !== null}
        intent={confirm?.kind === 'deactivate' ? Intent.DANGER : Intent.PRIMARY}
        icon={confirm?.kind === 'deactivate' ? 'disable' : 'swap-horizontal'}
        confirmButtonText={confirm?.kind === 'deactivate' ? 'Deactivate' : 'Change role'}
        cancelButtonText="Cancel"
        onCancel={() => setConfirm(null)}
        onConfirm={() => {
          if (confirm?.kind === 'deactivate') {
            run(
              { kind: 'deactivate', userId: user.id },
              `${user.displayName} is deactivated; their sessions have ended.`,
            );
          } else if (confirm?.kind === 'role') {
            run(
              { kind: 'update', userId: user.id, changes: { role: confirm.role } },
              'Role changed.',
            );
          }
          setConfirm(null);
        }}
      >
        {confirm?.kind === 'deactivate' ? (
          <p>
            Deactivate <strong>{user.displayName}</strong>? Their open sessions end now and they
            cannot sign in until reactivated. Nothing they sent is deleted.
          </p>
        ) : confirm?.kind === 'role' ? (
          <p>
            Make <strong>{user.displayName}</strong> {confirm.role === 'auditor' ? 'an' : 'a'}{' '}
            {roleLabels[confirm.role].toLowerCase()}?
            {user.role === 'practice_lead' && user.practices.length > 0
              ? ` Their ${user.practices.length === 1 ? 'practice' : `${user.practices.length} practices`} (${user.practices.map((p) => p.code).join(', ')}) will be removed.`
              : ''}
          </p>
        ) : null}
      </Alert>
    </Drawer>
  );
}
