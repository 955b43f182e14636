import { PageHeader, Section } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { SEVERITY_ORDER } from '../../shared/security/review';
import { useSecurityReview } from '../features/planning/api/planning';
import { SeverityBadge } from '../features/planning/components/severity-badge';
import { PlanningCaution } from '../features/planning/components/planning-caution';

export function SecurityReviewPage() {
  const review = useSecurityReview();
  if (review.isPending) return <Loading />;
  if (review.isError) return <LoadError error={review.error} />;
  const r = review.data;
  return (
    <>
      <PageHeader
        title="Security review"
        subtitle="Radios that leave traffic or the network open, most severe first. Keys are judged on the server and never shown here."
      />
      <ul className="flex flex-wrap gap-3" data-testid="security-counts">
        {SEVERITY_ORDER.map((s) => (
          <li key={s} className="flex items-center gap-2 rounded-lg border border-line bg-surface px-3 py-2 text-sm">
            <SeverityBadge severity={s} /> {r.counts[s]}
          </li>
        ))}
      </ul>

      <Section title="Across the network">
        {r.findings.length === 0 ? (
          <p className="text-sm">● No findings: every radio you review uses CCMP or SAE with a strong key and rekeying on.</p>
        ) : (
          <ol className="space-y-2" data-testid="security-findings">
            {r.findings.map((f, i) => (
              <li key={`${f.code}-${i}`} className="rounded-lg border border-line bg-surface p-3 text-sm">
                <div className="flex flex-wrap items-center gap-2">
                  <SeverityBadge severity={f.severity} />
                  <span className="font-medium">{f.radios.map((x) => `${x.nodeName} ${x.iface}`).join(', ')}</span>
                </div>
                <p className="mt-1">{f.message}</p>
                <p className="mt-1 text-muted">
                  <strong className="text-ink">Fix:</strong> {f.fix}
                </p>
              </li>
            ))}
          </ol>
        )}
      </Section>

      <Section title="Per radio">
        <div className="overflow-x-auto rounded-lg border border-line bg-surface">
          <table className="w-full text-sm" data-testid="security-radios">
            <thead className="bg-sunken text-left text-xs text-muted uppercase">
              <tr>
                <th className="px-3 py-2">Node</th>
                <th className="px-3 py-2">Radio</th>
                <th className="px-3 py-2">SSID</th>
                <th className="px-3 py-2">Encryption</th>
                <th className="px-3 py-2">Findings</th>
              </tr>
            </thead>
            <tbody>
              {r.radios.map((x) => (
                <tr key={x.radioId} className="border-t border-line align-top">
                  <td className="px-3 py-2">{x.nodeName}</td>
                  <td className="px-3 py-2">
                    {x.iface} <span className="text-xs text-muted">{x.role}</span>
                  </td>
                  <td className="px-3 py-2">{x.ssid ?? '—'}</td>
                  <td className="px-3 py-2">{x.encryption}</td>
                  <td className="px-3 py-2">
                    {x.findings.length === 0 ? (
                      '● none'
                    ) : (
                      <ul className="space-y-1">
                        {x.findings.map((f) => (
                          <li key={f.code} className="flex flex-wrap items-center gap-1.5">
                            <SeverityBadge severity={f.severity} /> {f.code.replaceAll('_', ' ')}
                          </li>
                        ))}
                      </ul>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Section>
      <PlanningCaution />
    </>
  );
}
