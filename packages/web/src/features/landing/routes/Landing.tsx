import { AnchorButton, Card, H1, H2, Intent } from '@blueprintjs/core';
import { CairnMark } from '../../../components/CairnMark';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { formatCount } from '../../../lib/format';
import { useAbout } from '../api/about';
import './Landing.css';

const roles = [
  {
    title: 'Practice leads',
    text: 'Send your quarterly extract, see exactly what was accepted and why anything was not, then follow your own completion, targets and recall list against your peers.',
  },
  {
    title: 'Regional leads',
    text: 'Open each audit quarter, watch submissions arrive, review the draft benchmark with fair comparisons, and publish a frozen report with its data pack.',
  },
  {
    title: 'Auditors',
    text: 'See which practices are genuinely out of line once chance, over-dispersion and case mix are allowed for, drill into why, and run review cases to a finding.',
  },
];

/** The signed-out front page: what Cairn is for, and the way in. */
export function Landing() {
  const about = useAbout();
  const region = about.data?.regionName;

  return (
    <div className="cairn-landing">
      <section className="cairn-hero" aria-labelledby="landing-title">
        <CairnMark size={72} title="Cairn mark" />
        <div>
          <H1 id="landing-title">Cairn</H1>
          <p className="cairn-hero-lede">
            Quarterly diabetes care audit and peer benchmarking{region ? ` for ${region}` : ''}:
            care processes done, treatment targets reached, and a fair comparison with similar
            practices.
          </p>
          {about.data && about.data.practices > 0 ? (
            <p className="cairn-hero-facts">
              {formatCount(about.data.practices)} practices in {formatCount(about.data.localities)}{' '}
              localities take part.
            </p>
          ) : null}
          <AnchorButton large intent={Intent.PRIMARY} icon="log-in" href="/sign-in">
            Sign in with your organisation
          </AnchorButton>
        </div>
      </section>

      <section className="cairn-roles" aria-label="Who Cairn is for">
        {roles.map((role) => (
          <Card key={role.title} className="cairn-role-card">
            <H2 className="cairn-role-title">{role.title}</H2>
            <p>{role.text}</p>
          </Card>
        ))}
      </section>

      <section className="cairn-principles" aria-label="How Cairn works">
        <ul>
          <li>
            Only de-identified data is accepted; dates are kept to the month and record references
            are keyed-hashed before anyone outside the practice sees them.
          </li>
          <li>
            Comparisons use control limits that depend on each practice&apos;s numbers, so a small
            practice is not called an outlier for bad luck.
          </li>
          <li>Published reports are frozen snapshots; small counts are suppressed.</li>
        </ul>
      </section>

      <ClinicalCaution />
    </div>
  );
}
