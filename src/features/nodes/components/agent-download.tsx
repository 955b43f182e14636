import { useState } from 'react';
import { Button } from '../../../components/button';
import { FormMessage } from '../../../components/form-field';
import { ApiError } from '../../../lib/api';
import { useIssueIngestToken } from '../api/telemetry';

const AGENT_PATH = '/agent/parapet-agent.sh';
const URL_LINE = 'PARAPET_URL="${PARAPET_URL:-__PARAPET_URL__}"';
const TOKEN_LINE = 'PARAPET_TOKEN="${PARAPET_TOKEN:-__PARAPET_TOKEN__}"';
// Both values go inside double quotes in a shell script: refuse anything the shell would expand.
const SHELL_SAFE = /^[A-Za-z0-9._~:/@%+=-]+$/;

/** The served agent with this node's address and token filled into its two placeholder lines. */
export function fillAgentScript(script: string, url: string, token: string): string {
  if (!script.includes(URL_LINE) || !script.includes(TOKEN_LINE)) {
    throw new Error('The agent script on the server has no placeholder lines to fill in. Tell an admin: the installed agent may be out of date.');
  }
  if (!SHELL_SAFE.test(url) || !SHELL_SAFE.test(token)) throw new Error('The address or token has characters the agent cannot carry safely.');
  return script.replace(URL_LINE, URL_LINE.replace('__PARAPET_URL__', url)).replace(TOKEN_LINE, TOKEN_LINE.replace('__PARAPET_TOKEN__', token));
}

async function fetchAgent(): Promise<string> {
  const response = await fetch(AGENT_PATH, { credentials: 'same-origin' });
  if (!response.ok) throw new Error(`Could not fetch the agent script (the server answered ${response.status}). Try again.`);
  return response.text();
}

function offerDownload(script: string, fileName: string) {
  const href = URL.createObjectURL(new Blob([script], { type: 'text/x-shellscript' }));
  const link = document.createElement('a');
  link.href = href;
  link.download = fileName;
  document.body.append(link);
  link.click();
  link.remove();
  // The click has started the download; the object URL is no longer needed.
  window.setTimeout(() => URL.revokeObjectURL(href), 1000);
}

/**
 * Issues the node a fresh ingest token and hands over the agent preconfigured with it. The token
 * is shown here once: the server keeps only its hash.
 */
export function AgentDownload({ nodeId, nodeName, hasReported }: { nodeId: number; nodeName: string; hasReported: boolean }) {
  const issue = useIssueIngestToken(nodeId);
  const [script, setScript] = useState<string | null>(null);
  const [token, setToken] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const fileName = `parapet-agent-${nodeName.replace(/[^A-Za-z0-9._-]+/g, '-')}.sh`;

  async function start() {
    if (hasReported && !window.confirm(`Issue a new token for “${nodeName}”? The agent now running on it stops being accepted until it gets the new one.`))
      return;
    setError(null);
    setBusy(true);
    try {
      const [newToken, template] = await Promise.all([issue.mutateAsync(), fetchAgent()]);
      setToken(newToken);
      const filled = fillAgentScript(template, window.location.origin, newToken);
      setScript(filled);
      offerDownload(filled, fileName);
    } catch (err) {
      setError(err instanceof ApiError || err instanceof Error ? err.message : 'Could not issue the token. Try again.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <div data-testid="agent-download" className="space-y-3 rounded-lg border border-line bg-surface p-4">
      <p className="text-sm text-muted">
        The heartbeat agent is a small shell script for the node's router. Downloading it issues a new token for this node and writes it, with this server's
        address, into the script.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button variant="primary" onClick={start} disabled={busy}>
          {busy ? 'Issuing…' : 'Issue token and download agent'}
        </Button>
        {script && <Button onClick={() => offerDownload(script, fileName)}>Download {fileName} again</Button>}
      </div>
      <FormMessage message={error} />
      {token && (
        <div role="status" className="rounded-md border border-caution/40 bg-caution-soft p-3 text-sm">
          <p className="font-medium">This token will not be shown again.</p>
          <p className="mt-1">
            It is already in the downloaded script. Copy it now only if you set the agent up by hand (as PARAPET_TOKEN); issuing another one stops this one
            working.
          </p>
          <code data-testid="ingest-token" className="mt-2 block rounded bg-surface px-2 py-1.5 font-mono text-xs break-all select-all">
            {token}
          </code>
        </div>
      )}
    </div>
  );
}
