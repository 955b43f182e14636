import { ButtonLink } from '../components/button';
import { paths } from '../lib/paths';

export function NotFoundPage({ what = 'page' }: { what?: string }) {
  return (
    <div className="mx-auto max-w-md py-16 text-center">
      <p className="text-sm font-medium text-muted">Not found</p>
      <h1 className="mt-1 text-2xl font-semibold">There is no such {what} here</h1>
      <p className="mt-2 text-sm text-muted">
        It may have been removed, the address may be mistyped, or it may belong to a part of the network you do not look after.
      </p>
      <ButtonLink to={paths.overview.to()} variant="primary" className="mt-6">
        Back to the overview
      </ButtonLink>
    </div>
  );
}
