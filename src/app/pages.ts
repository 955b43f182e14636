import { paths } from '../lib/paths';

/**
 * Every page: its address, its file in `src/routes/` (which exports `<PascalCaseFile>Page`) and whether it sits
 * inside the signed-in shell. The router builds its lazy routes from this list, and the server reads it to name,
 * in the HTML it sends, the scripts of the page being opened, so they download alongside the entry instead of after it.
 */
export interface PageEntry {
  pattern: string;
  file: string;
  signedIn: boolean;
}

const open = (pattern: string, file: string): PageEntry => ({ pattern, file, signedIn: false });
const inShell = (pattern: string, file: string): PageEntry => ({ pattern, file, signedIn: true });

export const pages: PageEntry[] = [
  open(paths.publicStatus.pattern, 'public-status'),
  // The host's phone page from the outage mail: the signed link is the permission, no sign-in.
  open(paths.hostRecovery.pattern, 'host-recovery'),
  open(paths.signIn.pattern, 'sign-in'),
  open(paths.forgotPassword.pattern, 'forgot-password'),
  open(paths.resetPassword.pattern, 'reset-password'),
  open(paths.acceptInvitation.pattern, 'accept-invitation'),
  inShell(paths.overview.pattern, 'overview'),
  inShell(paths.sites.pattern, 'sites'),
  inShell(paths.siteNew.pattern, 'site-new'),
  inShell(paths.siteDetail.pattern, 'site-detail'),
  inShell(paths.topology.pattern, 'topology'),
  inShell(paths.outages.pattern, 'outages'),
  inShell(paths.outageDetail.pattern, 'outage-detail'),
  inShell(paths.nodes.pattern, 'nodes'),
  inShell(paths.nodeDetail.pattern, 'node-detail'),
  inShell(paths.neighbourhoods.pattern, 'neighbourhoods'),
  inShell(paths.neighbourhoodDetail.pattern, 'neighbourhood-detail'),
  inShell(paths.planning.pattern, 'planning'),
  inShell(paths.linkBudget.pattern, 'link-budget'),
  inShell(paths.channelPlan.pattern, 'channel-plan'),
  inShell(paths.addressPlan.pattern, 'address-plan'),
  inShell(paths.securityReview.pattern, 'security-review'),
  inShell(paths.provisioningSheet.pattern, 'provisioning-sheet'),
  inShell(paths.people.pattern, 'people'),
  inShell(paths.imports.pattern, 'imports'),
  inShell(paths.reports.pattern, 'reports'),
  inShell(paths.preferences.pattern, 'preferences'),
  inShell(paths.myNodes.pattern, 'my-nodes'),
  inShell(paths.account.pattern, 'account'),
  inShell(paths.history.pattern, 'history'),
  inShell(paths.outbox.pattern, 'outbox'),
];

/** The only pages that never ask who is signed in; every other page asks at start-up (main.tsx, and the HTML preloads it). */
export const pagesWithoutSession: string[] = [paths.publicStatus.pattern, paths.hostRecovery.pattern];

/** `my-nodes` → `MyNodesPage`: the component each page file exports. */
export const componentName = (file: string) =>
  `${file
    .split('-')
    .map((word) => word.charAt(0).toUpperCase() + word.slice(1))
    .join('')}Page`;

/** Where the build's manifest lists a page's file, and the signed-in shell's. */
export const pageSource = (file: string) => `src/routes/${file}.tsx`;
export const SIGNED_IN_SHELL_SOURCE = 'src/app/signed-in-layout.tsx';
