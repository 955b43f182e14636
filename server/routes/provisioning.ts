import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { describeSubnet, parseCidr } from '../../shared/addressing/cidr';
import { channelCenterMHz } from '../../shared/radio/channels';
import { eirpDbm } from '../../shared/radio/linkBudget';
import { idParamsSchema } from '../../shared/schemas/common';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { NetworkSettings, Radio, Site } from '../models';
import { mayManage } from '../policies/actor';
import { loadPlan } from '../services/addressPlans';
import { readableNode } from '../services/references';

/** Where nodes report and where the agent script is served (see public/agent). */
export const AGENT_PATH = '/agent/parapet-agent.sh';
export const HEARTBEAT_PATH = '/api/v1/heartbeats';

/**
 * Every setting the installer types into the router. The pre-shared key is included only for admins and the
 * operators of the node's neighbourhood; everyone else who may read the node gets the sheet without it.
 */
export function provisioningRoutes(sequelize: Sequelize) {
  const router = Router({ mergeParams: true });
  router.get('/', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    const mayReadKeys = mayManage(actor, node.neighbourhoodId);
    const [site, radios, plan, settings] = await Promise.all([
      Site.findByPk(node.siteId, { rejectOnEmpty: true }),
      Radio.findAll({ where: { nodeId: node.id }, order: [['iface', 'ASC']] }),
      loadPlan(sequelize, node.id),
      NetworkSettings.findByPk(1, { rejectOnEmpty: true }),
    ]);
    const subnet = plan ? describeSubnet(parseCidr(plan.cidr)) : null;
    res.set('Cache-Control', 'no-store');
    res.json({
      data: {
        node: {
          id: node.id,
          name: node.name,
          hardware: node.hardware ?? null,
          firmware: node.firmware ?? null,
          managementAddress: node.managementAddress ?? null,
          reportIntervalS: node.reportIntervalS,
        },
        site: { id: site.id, name: site.name, latitude: site.latitude, longitude: site.longitude, antennaHeightM: site.antennaHeightM },
        region: settings.region,
        timeZone: settings.timeZone,
        addresses:
          plan && subnet
            ? {
                cidr: plan.cidr,
                netmask: subnet.netmask,
                gateway: plan.gateway,
                broadcast: subnet.broadcast,
                dhcpStart: plan.dhcpStart,
                dhcpEnd: plan.dhcpEnd,
                staticAddresses: plan.staticAddresses,
              }
            : null,
        radios: radios.map((r) => ({
          id: r.id,
          iface: r.iface,
          role: r.role,
          band: r.band,
          channel: r.channel,
          centerMHz: safeCenter(r.band, r.channel),
          channelWidthMHz: r.channelWidthMHz,
          txPowerDbm: r.txPowerDbm,
          antennaGainDbi: r.antennaGainDbi,
          cableLossDb: r.cableLossDb,
          eirpDbm: Math.round(eirpDbm(r.txPowerDbm, r.antennaGainDbi, r.cableLossDb) * 100) / 100,
          polarisation: r.polarisation,
          ssid: r.ssid ?? null,
          encryption: r.encryption,
          groupRekeyS: r.groupRekeyS,
          hasPreSharedKey: Boolean(r.preSharedKey),
          ...(mayReadKeys ? { preSharedKey: r.preSharedKey ?? null } : {}),
        })),
        agent: { scriptPath: AGENT_PATH, reportPath: HEARTBEAT_PATH },
        abilities: { readKeys: mayReadKeys, issueToken: mayReadKeys },
      },
    });
  });
  return router;
}

function safeCenter(band: '2.4' | '5', channel: number): number | null {
  try {
    return channelCenterMHz(band, channel);
  } catch {
    return null;
  }
}
