import { useNavigate } from 'react-router-dom';
import { PageHeader } from '../components/page-header';
import { useCurrentUser } from '../features/auth/api/session';
import { useNeighbourhoods } from '../features/neighbourhoods/api/neighbourhoods';
import { useHostCandidates } from '../features/sites/api/sites';
import { SiteForm } from '../features/sites/components/site-form';
import { paths } from '../lib/paths';
import { ALL_BY_NAME, toOptions } from '../lib/resource';

export function SiteNewPage() {
  const navigate = useNavigate();
  const user = useCurrentUser();
  const neighbourhoods = useNeighbourhoods(ALL_BY_NAME);
  // Admins pick anyone active; operators the people already hosting in their neighbourhoods, or themselves.
  const people = useHostCandidates(user?.role === 'admin' || user?.role === 'operator');

  return (
    <>
      <PageHeader title="Add site" subtitle="A roof, window or balcony that will carry a node." />
      <SiteForm
        neighbourhoodOptions={toOptions(neighbourhoods.data?.data)}
        hostOptions={people.isSuccess ? toOptions(people.data.data) : null}
        onSaved={(site) => navigate(paths.siteDetail.to(site.id))}
        onCancel={() => navigate(paths.sites.to())}
      />
    </>
  );
}
