import express, { type NextFunction, type Request, type Response, Router } from 'express';
import { preferencesUpdateSchema, type PreferencesDto } from '../../shared/schemas/alerts';
import type { Config } from '../config';
import { ApiError } from '../errors';
import { checkbox, confirmForm, esc, page, radio, timeInput } from '../mail/linkPages';
import { type LinkPurpose, verifyLink } from '../mail/signedLinks';
import { issuesToDetails } from '../middlewares/validate';
import { Node, Outage, User } from '../models';
import { loadActor, mayManage } from '../policies/actor';
import { preferencesOf, unsubscribeAll, updatePreferences } from '../services/preferences';

type Handler = (req: Request, res: Response) => Promise<void>;

/** Errors on these pages are pages too (a person followed a link from mail), with the API's status codes. */
const html = (fn: Handler) => (req: Request, res: Response, next: NextFunction) =>
  fn(req, res).catch((err) => {
    if (!(err instanceof ApiError)) return next(err);
    const title = err.status === 410 ? 'This link has expired' : err.status === 400 ? 'This link cannot be used' : 'Not possible';
    res
      .status(err.status)
      .type('html')
      .send(page(title, `<p data-code="${esc(err.code)}">${esc(err.message)}</p>`));
  });

const tokenOf = (req: Request) => (req.query.t ?? (req.body as Record<string, unknown> | undefined)?.t) as unknown;

/** The links in outage mail: acknowledge, preferences and one-click unsubscribe. The signature is the permission; no sign-in. */
export function mailLinkRoutes(config: Config) {
  const router = Router();
  router.use(express.urlencoded({ extended: false, limit: '4kb' }));
  router.use((_req, res, next) => {
    res.set({ 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' });
    next();
  });

  const claimsOf = async (req: Request, purpose: LinkPurpose) => {
    const claims = verifyLink(config.sessionSecret, tokenOf(req), purpose, config.now());
    const actor = await loadActor(claims.userId);
    if (!actor) throw new ApiError(404, 'not_found', 'The person this link was sent to no longer has an active account.');
    return { claims, actor, token: String(tokenOf(req)) };
  };

  async function loadAckable(req: Request) {
    const { claims, actor, token } = await claimsOf(req, 'acknowledge');
    const outage = await Outage.findByPk(claims.outageId, {
      include: [
        { model: Node, as: 'node', required: true },
        { model: User, as: 'acknowledger', required: false },
      ],
    });
    if (!outage) throw new ApiError(404, 'not_found', 'This outage is no longer recorded.');
    if (!mayManage(actor, outage.node!.neighbourhoodId)) {
      throw new ApiError(403, 'forbidden', 'You are no longer an operator of this node’s neighbourhood, so you cannot acknowledge its outage.');
    }
    return { outage, actor, token };
  }

  const ackState = (o: Outage) =>
    o.acknowledgedAt
      ? `<p>Already acknowledged${o.acknowledger ? ` by ${esc(o.acknowledger.name)}` : ''} at ${esc(o.acknowledgedAt.toISOString())}. No more reminders will be sent.</p>`
      : '';

  router.get(
    '/acknowledge',
    html(async (req, res) => {
      const { outage, token } = await loadAckable(req);
      const name = esc(outage.node!.name);
      const body = outage.acknowledgedAt
        ? ackState(outage)
        : outage.endedAt
          ? `<p>${name} is back online; this outage is over and needs no acknowledgement.</p>`
          : `<p>Acknowledge the outage of <strong>${name}</strong> (since ${esc(outage.startedAt.toISOString())})? This tells the other operators someone is on it and stops the reminders.</p>` +
            confirmForm('acknowledge', token, 'Acknowledge outage');
      res.type('html').send(page(`Outage of ${outage.node!.name}`, body));
    }),
  );

  router.post(
    '/acknowledge',
    html(async (req, res) => {
      const { outage, actor } = await loadAckable(req);
      if (!outage.acknowledgedAt) await outage.update({ acknowledgedAt: config.now(), acknowledgedBy: actor.id });
      await outage.reload({
        include: [
          { model: Node, as: 'node' },
          { model: User, as: 'acknowledger', required: false },
        ],
      });
      res.type('html').send(page(`Outage of ${outage.node!.name}`, ackState(outage)));
    }),
  );

  router.get(
    '/unsubscribe',
    html(async (req, res) => {
      const { actor, token } = await claimsOf(req, 'unsubscribe');
      res
        .type('html')
        .send(
          page(
            'Unsubscribe',
            `<p>Stop all Parapet mail to ${esc(actor.email)}? You can choose mail again later in your preferences.</p>${confirmForm('unsubscribe', token, 'Unsubscribe')}`,
          ),
        );
    }),
  );

  // RFC 8058 one-click: the mail client POSTs "List-Unsubscribe=One-Click" to the header's URL.
  router.post(
    '/unsubscribe',
    html(async (req, res) => {
      const { actor } = await claimsOf(req, 'unsubscribe');
      await unsubscribeAll(actor.id, config.now());
      res.type('html').send(page('Unsubscribed', `<p>Parapet will send no more mail to ${esc(actor.email)}.</p>`));
    }),
  );

  router.get(
    '/preferences',
    html(async (req, res) => {
      const { actor, token } = await claimsOf(req, 'preferences');
      res.type('html').send(page('Your mail from Parapet', confirmForm('preferences', token, 'Save', preferenceFields(await preferencesOf(actor)))));
    }),
  );

  router.post(
    '/preferences',
    html(async (req, res) => {
      const { actor, token } = await claimsOf(req, 'preferences');
      const current = await preferencesOf(actor);
      const parsed = preferencesUpdateSchema.safeParse(fromForm(req.body as Record<string, string>, current));
      if (!parsed.success) {
        const problems = issuesToDetails(parsed.error)
          .map((d) => `<li>${esc(d.message)}</li>`)
          .join('');
        res
          .status(400)
          .type('html')
          .send(page('Please check your choices', `<ul>${problems}</ul>${confirmForm('preferences', token, 'Save', preferenceFields(current))}`));
        return;
      }
      const saved = await updatePreferences(actor, parsed.data);
      res.type('html').send(page('Your mail from Parapet', `<p>Saved.</p>${confirmForm('preferences', token, 'Save', preferenceFields(saved))}`));
    }),
  );

  return router;
}

/** Form fields → the same update the API takes; only the groups that apply to the person are read. */
function fromForm(body: Record<string, string>, p: PreferencesDto) {
  const quiet = (v: string | undefined) => (v ? v : null);
  return {
    ...(p.applies.operator ? { operatorMode: body.operatorMode, degradedDigest: body.degradedDigest === 'on' } : {}),
    ...(p.applies.host ? { hostMail: body.hostMail === 'on', quietStart: quiet(body.quietStart), quietEnd: quiet(body.quietEnd) } : {}),
    ...(p.applies.admin
      ? { adminNodeMail: body.adminNodeMail === 'on', adminSelfCheck: body.adminSelfCheck === 'on', upstreamNotices: body.upstreamNotices === 'on' }
      : {}),
  };
}

function preferenceFields(p: PreferencesDto): string {
  const parts: string[] = [];
  if (p.unsubscribedAt) parts.push('<p>You unsubscribed from all Parapet mail. Choosing any mail below turns it back on.</p>');
  if (p.applies.operator) {
    parts.push(
      `<fieldset><legend>Outage mail for your neighbourhoods</legend>${radio('operatorMode', 'immediate', 'Right away', p.operatorMode === 'immediate')}${radio('operatorMode', 'hourly', 'One digest an hour', p.operatorMode === 'hourly')}${radio('operatorMode', 'off', 'None', p.operatorMode === 'off')}${checkbox('degradedDigest', 'Daily digest of nodes degraded for hours', p.degradedDigest)}</fieldset>`,
    );
  }
  if (p.applies.host) {
    parts.push(
      `<fieldset><legend>The node on your roof</legend>${checkbox('hostMail', 'Tell me when it stops answering and when it is back', p.hostMail)}<p>Quiet hours (${esc(p.timeZone)}): mail waits until they end.</p>${timeInput('quietStart', 'From', p.quietStart)}${timeInput('quietEnd', 'Until', p.quietEnd)}</fieldset>`,
    );
  }
  if (p.applies.admin) {
    parts.push(
      `<fieldset><legend>Admin mail</legend>${checkbox('adminNodeMail', 'Outage mail for every node', p.adminNodeMail)}${checkbox('adminSelfCheck', 'When Parapet finds it had stopped watching', p.adminSelfCheck)}${checkbox('upstreamNotices', 'Upstream notices', p.upstreamNotices)}</fieldset>`,
    );
  }
  if (!parts.length) parts.push('<p>Parapet has no mail for you in your current role.</p>');
  return parts.join('');
}
