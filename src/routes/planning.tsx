import { Link } from 'react-router-dom';
import { PageHeader } from '../components/page-header';
import { paths } from '../lib/paths';
import { PlanningCaution } from '../features/planning/components/planning-caution';

const PAGES = [
  {
    to: paths.linkBudget.to(),
    title: 'Link budget',
    text: 'Will a link between two masts close? Loss, signal, fade margin, Fresnel zone and the legal power limit.',
  },
  {
    to: paths.channelPlan.to(),
    title: 'Channel plan',
    text: 'Upload site surveys, see congestion per channel and apply a recommended channel for every radio.',
  },
  { to: paths.addressPlan.to(), title: 'Address plan', text: 'Give each node a subnet and DHCP range from the network’s pool, with overlap and range checks.' },
  { to: paths.securityReview.to(), title: 'Security review', text: 'Open networks, WEP, TKIP, weak or reused keys and disabled rekeying, most severe first.' },
];

export function PlanningPage() {
  return (
    <>
      <PageHeader title="Planning" subtitle="Work it out before the climb." />
      <ul className="grid gap-4 sm:grid-cols-2" data-testid="planning-index">
        {PAGES.map((p) => (
          <li key={p.to}>
            <Link to={p.to} className="block h-full rounded-lg border border-line bg-surface p-4 hover:border-accent">
              <h2 className="font-semibold">{p.title}</h2>
              <p className="mt-1 text-sm text-muted">{p.text}</p>
            </Link>
          </li>
        ))}
      </ul>
      <p className="mt-6 text-sm text-muted">
        Each node’s provisioning sheet (every setting to type into its router) opens from the address plan and at /nodes/&lt;id&gt;/provisioning.
      </p>
      <PlanningCaution />
    </>
  );
}
