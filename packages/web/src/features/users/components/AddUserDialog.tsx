import {
  Button,
  Classes,
  Dialog,
  DialogBody,
  DialogFooter,
  FormGroup,
  HTMLSelect,
  InputGroup,
  Intent,
} from '@blueprintjs/core';
import { type FormEvent, useState } from 'react';
import { type Role, roleValues } from '../../../lib/api/types';
import { roleLabels } from '../../../lib/roles';
import type { Practice, User } from '../../../lib/api/types';
import { useCreateUser } from '../api/users';
import { PracticePicker } from './PracticePicker';
import { fieldError, ProblemCallout } from '../../../components/ProblemCallout';

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

interface Props {
  isOpen: boolean;
  onClose: () => void;
  onCreated: (user: User) => void;
  practices: Practice[];
}

/** Adds a person Cairn will then let in at sign-in. */
export function AddUserDialog({ isOpen, onClose, onCreated, practices }: Props) {
  const create = useCreateUser();
  const [email, setEmail] = useState('');
  const [displayName, setDisplayName] = useState('');
  const [role, setRole] = useState<Role>('practice_lead');
  const [chosen, setChosen] = useState<number[]>([]);
  const [touched, setTouched] = useState(false);

  const problems = {
    email: !EMAIL.test(email.trim())
      ? 'Enter an e-mail address such as name@practice.example.'
      : undefined,
    displayName: !displayName.trim() ? 'Enter the name to show in Cairn.' : undefined,
    practices:
      role === 'practice_lead' && chosen.length === 0
        ? 'A practice lead needs at least one practice.'
        : undefined,
  };
  const valid = !problems.email && !problems.displayName && !problems.practices;

  const reset = () => {
    setEmail('');
    setDisplayName('');
    setRole('practice_lead');
    setChosen([]);
    setTouched(false);
    create.reset();
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setTouched(true);
    if (!valid) return;
    create.mutate(
      {
        email: email.trim(),
        displayName: displayName.trim(),
        role,
        practiceIds: role === 'practice_lead' ? chosen : [],
      },
      {
        onSuccess: (user) => {
          reset();
          onCreated(user);
        },
      },
    );
  };

  const close = () => {
    reset();
    onClose();
  };

  const show = (local: string | undefined, field: string) =>
    (touched ? local : undefined) ?? fieldError(create.error, field);
  const chosenPractices = practices.filter((p) => chosen.includes(p.id));

  return (
    <Dialog isOpen={isOpen} onClose={close} title="Add a person" icon="new-person">
      <form onSubmit={submit} noValidate>
        <DialogBody>
          <p className={Classes.TEXT_MUTED}>
            They can sign in as soon as they are added, with the e-mail address their organisation
            knows them by.
          </p>
          <FormGroup
            label="E-mail address"
            labelFor="new-user-email"
            intent={show(problems.email, 'email') ? Intent.DANGER : Intent.NONE}
            helperText={show(problems.email, 'email')}
          >
            <InputGroup
              id="new-user-email"
              type="email"
              value={email}
              onValueChange={setEmail}
              autoFocus
              intent={show(problems.email, 'email') ? Intent.DANGER : Intent.NONE}
            />
          </FormGroup>
          <FormGroup
            label="Name"
            labelFor="new-user-name"
            intent={show(problems.displayName, 'displayName') ? Intent.DANGER : Intent.NONE}
            helperText={show(problems.displayName, 'displayName')}
          >
            <InputGroup
              id="new-user-name"
              value={displayName}
              onValueChange={setDisplayName}
              intent={show(problems.displayName, 'displayName') ? Intent.DANGER : Intent.NONE}
            />
          </FormGroup>
          <FormGroup label="Role" labelFor="new-user-role">
            <HTMLSelect
              id="new-user-role"
              value={role}
              onChange={(e) => setRole(e.currentTarget.value as Role)}
              fill
            >
              {roleValues.map((r) => (
                <option key={r} value={r}>
                  {roleLabels[r]}
                </option>
              ))}
            </HTMLSelect>
          </FormGroup>
          {role === 'practice_lead' ? (
            <FormGroup
              label="Practices"
              intent={show(problems.practices, 'practiceIds') ? Intent.DANGER : Intent.NONE}
              helperText={show(problems.practices, 'practiceIds')}
            >
              <PracticePicker
                label="Practice to add"
                value={chosenPractices}
                options={practices}
                onAdd={(id) => setChosen((c) => [...c, id])}
                onRemove={(id) => setChosen((c) => c.filter((x) => x !== id))}
              />
            </FormGroup>
          ) : (
            <p className={Classes.TEXT_MUTED}>
              {roleLabels[role]}s read every practice of the region
              {role === 'auditor' ? ' and change nothing' : ''}.
            </p>
          )}
          {create.error && !fieldError(create.error, 'email') ? (
            <ProblemCallout error={create.error} />
          ) : null}
        </DialogBody>
        <DialogFooter
          actions={
            <>
              <Button onClick={close}>Cancel</Button>
              <Button type="submit" intent={Intent.PRIMARY} loading={create.isPending} icon="add">
                Add person
              </Button>
            </>
          }
        />
      </form>
    </Dialog>
  );
}
