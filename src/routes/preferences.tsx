import { PageHeader } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { usePreferences } from '../features/alerts/api/alerts';
import { PreferencesForm } from '../features/alerts/components/preferences-form';

export function PreferencesPage() {
  const preferences = usePreferences();
  return (
    <>
      <PageHeader
        title="Mail preferences"
        subtitle="What Parapet mails you about outages. Every message also carries a link back here and a one-click unsubscribe."
      />
      {preferences.isPending ? <Loading /> : preferences.isError ? <LoadError error={preferences.error} /> : <PreferencesForm preferences={preferences.data} />}
    </>
  );
}
