import { Link } from 'react-router-dom';
import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useMe } from '../features/people/api/account';
import { ChangePasswordForm } from '../features/people/components/change-password-form';
import { ContactForm } from '../features/people/components/contact-form';
import { paths } from '../lib/paths';

export function AccountPage() {
  const me = useMe();
  return (
    <>
      <PageHeader title="Your account" subtitle="Your contact details and password. Your role is set by the network’s admins." />
      {me.isPending ? (
        <Loading />
      ) : me.isError ? (
        <LoadError error={me.error} />
      ) : (
        <>
          <Section title="Contact details">
            <ContactForm me={me.data} />
          </Section>
          <Section title="Password">
            <ChangePasswordForm />
          </Section>
          <p className="mt-6 text-sm">
            What Parapet mails you, and quiet hours:{' '}
            <Link to={paths.preferences.to()} className="text-accent underline">
              mail preferences
            </Link>
            .
          </p>
        </>
      )}
    </>
  );
}
