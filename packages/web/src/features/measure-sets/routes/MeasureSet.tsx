import {
  Alert,
  Button,
  Callout,
  H2,
  H3,
  HTMLTable,
  Intent,
  NonIdealState,
  Spinner,
  Tag,
} from '@blueprintjs/core';
import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { Measure, MeasureSet as Version } from '../../../lib/api/types';
import { formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { useDiscardDraft, useMeasureSet, usePublishDraft } from '../api/measure-sets';
import { ChangesTable } from '../components/ChangesTable';
import { EditDialog } from '../components/EditDialog';
import { TextField, NumberField } from '../components/Fields';
import {
  type MeasureDefinition,
  MeasureForm,
  type MeasureList,
  measureFields,
  measureNumbers,
} from '../components/MeasureForm';
import { MeasureSetStatusTag } from '../components/MeasureSetStatusTag';
import { StartDraftDialog } from '../components/StartDraftDialog';
import { directionWords } from '../components/words';
import './MeasureSets.css';

type Editing = { kind: 'settings' } | { kind: 'measure'; list: MeasureList; index: number } | null;

/**
 * `/measure-sets/:measureSetId`: one version, every measure with its
 * definition in words, denominator, direction, population and guideline.
 * A regional lead starts a draft from a published version; on a draft they
 * edit each measure and the set's settings, read the differences from the
 * version it came from, and publish it (or discard it).
 */
export function MeasureSet() {
  const { measureSetId = '' } = useParams();
  const version = useMeasureSet(measureSetId);
  usePageTitle(version.data ? version.data.label : 'Measure set');
  if (version.isPending) return <Spinner aria-label="Loading the measure set" />;
  if (version.isError) {
    return (
      <div className="cairn-measure-set">
        <ProblemCallout error={version.error} />
        <p>
          <Link to="/measure-sets">All measure sets</Link>
        </p>
      </div>
    );
  }
  return <VersionPage version={version.data} />;
}

function VersionPage({ version }: { version: Version }) {
  const [editing, setEditing] = useState<Editing>(null);
  const [starting, setStarting] = useState(false);
  const [publishing, setPublishing] = useState(false);
  const [discarding, setDiscarding] = useState(false);
  const publish = usePublishDraft(version.id);
  const discard = useDiscardDraft(version.id);
  const navigate = useNavigate();
  const { actions } = version;
  const processes = version.measures.filter((m) => m.kind === 'care_process');
  const targets = version.measures.filter((m) => m.kind === 'treatment_target');

  return (
    <div className="cairn-measure-set">
      <p className="cairn-small">
        <Link to="/measure-sets">Measure sets</Link> ›
      </p>
      <div className="cairn-page-head">
        <div>
          <H2>
            {version.label} <MeasureSetStatusTag status={version.status} />
          </H2>
          <p className="cairn-muted">
            {version.id}
            {version.isDefault ? ' · default for new quarters' : ''}
            {version.shippedWithCairn ? ' · shipped with Cairn' : ''}
          </p>
          {version.description ? <p>{version.description}</p> : null}
        </div>
        <div className="cairn-head-actions">
          {actions.clone ? (
            <Button icon="duplicate" intent={Intent.PRIMARY} onClick={() => setStarting(true)}>
              Start a draft from this version
            </Button>
          ) : null}
          {actions.edit ? (
            <Button icon="cog" onClick={() => setEditing({ kind: 'settings' })}>
              Edit settings
            </Button>
          ) : null}
          {actions.publish ? (
            <Button icon="endorsed" intent={Intent.PRIMARY} onClick={() => setPublishing(true)}>
              Publish…
            </Button>
          ) : null}
          {actions.discard ? (
            <Button
              icon="trash"
              variant="minimal"
              intent={Intent.DANGER}
              onClick={() => setDiscarding(true)}
            >
              Discard draft…
            </Button>
          ) : null}
        </div>
      </div>

      {version.status === 'draft' ? (
        <Callout intent={Intent.WARNING} icon="edit" title="A draft">
          Nothing uses a draft. Each change is checked and saved as you make it; publish the draft
          to make it a version that audit quarters can use. Once published it never changes.
        </Callout>
      ) : null}
      <ProblemCallout error={publish.error ?? discard.error} />

      <dl className="cairn-facts">
        <dt>Started</dt>
        <dd>
          {formatDateTime(version.createdAt)} by {version.createdBy}
          {version.basedOn ? (
            <>
              , from{' '}
              <Link to={`/measure-sets/${encodeURIComponent(version.basedOn)}`}>
                {version.basedOn}
              </Link>
            </>
          ) : null}
        </dd>
        <dt>Published</dt>
        <dd>
          {version.publishedAt
            ? `${formatDateTime(version.publishedAt)} by ${version.publishedBy}`
            : 'Not yet'}
        </dd>
        <dt>Used by</dt>
        <dd>
          {version.usedBy.length === 0
            ? 'No audit quarter yet'
            : version.usedBy.map((u) => (
                <Tag key={`${u.kind}-${u.id}`} minimal icon="calendar" className="cairn-use">
                  {u.label} ({u.status})
                </Tag>
              ))}
        </dd>
        <dt>Counted from age</dt>
        <dd>{version.eligibilityMinAge}</dd>
        <dt>Retinal window</dt>
        <dd>{version.retinalWindowMonths} months ending with the quarter</dd>
        <dt>Content (SHA-256)</dt>
        <dd>
          <code title={version.contentHash}>{version.contentHash.slice(0, 16)}…</code>
        </dd>
      </dl>

      {version.basedOn ? (
        <section aria-labelledby="changes-heading">
          <H3 id="changes-heading">Changes from {version.basedOn}</H3>
          <ChangesTable id={version.id} basedOn={version.basedOn} />
        </section>
      ) : null}

      <ClinicalCaution />

      <MeasuresSection
        title="Care processes"
        id="care-processes"
        measures={processes}
        canEdit={actions.edit}
        onEdit={(index) => setEditing({ kind: 'measure', list: 'careProcesses', index })}
      />
      <MeasuresSection
        title="Treatment targets"
        id="treatment-targets"
        measures={targets}
        canEdit={actions.edit}
        onEdit={(index) => setEditing({ kind: 'measure', list: 'targets', index })}
      />

      {starting ? <StartDraftDialog from={version} onClose={() => setStarting(false)} /> : null}
      {editing?.kind === 'settings' ? (
        <SettingsDialog version={version} onClose={() => setEditing(null)} />
      ) : null}
      {editing?.kind === 'measure' ? (
        <MeasureDialog
          version={version}
          list={editing.list}
          index={editing.index}
          onClose={() => setEditing(null)}
        />
      ) : null}
      <Alert
        isOpen={publishing}
        icon="endorsed"
        intent={Intent.PRIMARY}
        confirmButtonText={`Publish ${version.id}`}
        cancelButtonText="Cancel"
        loading={publish.isPending}
        onCancel={() => setPublishing(false)}
        onConfirm={() =>
          publish.mutate(version.revision, { onSettled: () => setPublishing(false) })
        }
      >
        <p>
          Publish <strong>{version.label}</strong> ({version.id}) as a new version? Audit quarters
          can then use it, and it never changes again.
        </p>
      </Alert>
      <Alert
        isOpen={discarding}
        icon="trash"
        intent={Intent.DANGER}
        confirmButtonText="Discard the draft"
        cancelButtonText="Keep it"
        loading={discard.isPending}
        onCancel={() => setDiscarding(false)}
        onConfirm={() =>
          discard.mutate(undefined, {
            onSuccess: () => navigate('/measure-sets'),
            onSettled: () => setDiscarding(false),
          })
        }
      >
        <p>Discard the draft {version.id}? Its changes are lost; nothing else changes.</p>
      </Alert>
    </div>
  );
}

function MeasuresSection({
  title,
  id,
  measures,
  canEdit,
  onEdit,
}: {
  title: string;
  id: string;
  measures: Measure[];
  canEdit: boolean;
  onEdit: (index: number) => void;
}) {
  return (
    <section aria-labelledby={`${id}-heading`}>
      <H3 id={`${id}-heading`}>
        {title} ({measures.length})
      </H3>
      {measures.length === 0 ? (
        <NonIdealState icon="blank" title={`No ${title.toLowerCase()}`} layout="horizontal" />
      ) : (
        <HTMLTable compact striped className="cairn-measures-table">
          <thead>
            <tr>
              <th scope="col">Measure</th>
              <th scope="col">Met when</th>
              <th scope="col">Population</th>
              <th scope="col">Denominator</th>
              <th scope="col">Direction</th>
              <th scope="col">Guideline source</th>
              {canEdit ? <th scope="col">Edit</th> : null}
            </tr>
          </thead>
          <tbody>
            {measures.map((m, index) => (
              <tr key={m.key} data-measure={m.key}>
                <th scope="row">
                  {m.label}
                  <div className="cairn-muted cairn-small">{m.key}</div>
                </th>
                <td>
                  {m.definition}
                  {m.note ? <div className="cairn-muted cairn-small">{m.note}</div> : null}
                </td>
                <td>{m.population.text}</td>
                <td>{m.denominatorText}</td>
                <td className="cairn-nowrap">{directionWords[m.direction]}</td>
                <td className="cairn-source">{m.source}</td>
                {canEdit ? (
                  <td>
                    <Button
                      small
                      icon="edit"
                      onClick={() => onEdit(index)}
                      aria-label={`Edit ${m.label}`}
                    >
                      Edit
                    </Button>
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      )}
    </section>
  );
}

function MeasureDialog({
  version,
  list,
  index,
  onClose,
}: {
  version: Version;
  list: MeasureList;
  index: number;
  onClose: () => void;
}) {
  const measure = version.definition[list][index] as MeasureDefinition;
  return (
    <EditDialog<MeasureDefinition>
      set={version}
      title={`Edit ${measure.label}`}
      at={`${list}[${index}]`}
      initial={measure}
      numbers={(m) => measureNumbers(m, list)}
      shown={(m) => measureFields(m, list)}
      idPrefix={`measure-${measure.key}`}
      onClose={onClose}
    >
      {(ctx) => (
        <MeasureForm
          ctx={ctx}
          measure={ctx.value}
          definition={version.definition}
          list={list}
          index={index}
        />
      )}
    </EditDialog>
  );
}

interface Settings {
  label: string;
  description?: string;
  retinalWindowMonths: number | string;
  eligibility: { minAge: number | string };
}

function SettingsDialog({ version, onClose }: { version: Version; onClose: () => void }) {
  const d = version.definition;
  return (
    <EditDialog<Settings>
      set={version}
      title={`Settings of ${version.id}`}
      at=""
      initial={{
        label: d.label,
        description: d.description,
        retinalWindowMonths: d.retinalWindowMonths,
        eligibility: { minAge: d.eligibility.minAge },
      }}
      numbers={() => [
        { path: 'retinalWindowMonths', nullable: false },
        { path: 'eligibility.minAge', nullable: false },
      ]}
      shown={() => new Set(['label', 'description', 'retinalWindowMonths', 'eligibility.minAge'])}
      idPrefix="settings"
      onClose={onClose}
    >
      {(ctx) => (
        <>
          <TextField ctx={ctx} path="label" label="Label" />
          <TextField
            ctx={ctx}
            path="description"
            label="Description (optional)"
            multiline
            optional
          />
          <NumberField
            ctx={ctx}
            path="retinalWindowMonths"
            label="Retinal window"
            unit="months"
            hint="How long a retinal screening counts for (12, or 24 where low-risk people are screened every two years)."
          />
          <NumberField
            ctx={ctx}
            path="eligibility.minAge"
            label="Counted from age"
            unit="years"
            hint="People younger than this at the end of the review window are not counted."
          />
        </>
      )}
    </EditDialog>
  );
}
