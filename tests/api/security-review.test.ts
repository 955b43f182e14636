import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Radio } from '../../server/models';
import { call, useApi } from '../helpers/api';
import { buildRadio } from '../helpers/factories';
import { planningCast } from '../helpers/planningActors';

const WEAK = 'password1';
const SHARED = 'tide-lantern-orchard-51';

describe('security review API', () => {
  const ctx = useApi();

  it('answers 401 signed out and 403 to hosts', async () => {
    expect((await request(ctx.app).get('/api/v1/security-review')).status).toBe(401);
    const { host } = await planningCast(ctx);
    const res = await call(host, 'get', '/api/v1/security-review');
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe('The security review is for operators and admins.');
  });

  it('lists findings most severe first, scoped to the caller, and never echoes a key', async () => {
    const { op, admin, node, otherNode } = await planningCast(ctx);
    const open = await buildRadio({ nodeId: node.id, iface: 'wlan0' });
    await Radio.update({ encryption: 'none', preSharedKey: null, role: 'backhaul-ap' }, { where: { id: open.id } });
    const weak = await buildRadio({ nodeId: node.id, iface: 'wlan1' });
    await Radio.update({ preSharedKey: WEAK, groupRekeyS: 0, role: 'access-point' }, { where: { id: weak.id } });
    const shared = await buildRadio({ nodeId: node.id, iface: 'wlan2' });
    const elsewhere = await buildRadio({ nodeId: otherNode.id, iface: 'wlan0' });
    const tkip = await buildRadio({ nodeId: otherNode.id, iface: 'wlan1' });
    await Radio.update({ preSharedKey: SHARED }, { where: { id: [shared.id, elsewhere.id] } });
    await Radio.update({ encryption: 'wpa-tkip' }, { where: { id: tkip.id } });

    const res = await call(op, 'get', '/api/v1/security-review');
    expect(res.status).toBe(200);
    const text = JSON.stringify(res.body);
    for (const key of [WEAK, SHARED, 'a-long-enough-test-key']) expect(text).not.toContain(key);
    const findings = res.body.data.findings as { code: string; severity: string; radios: { radioId: number }[] }[];
    expect(findings.map((f) => f.code)).toEqual(['open_network', 'psk_weak', 'key_reused', 'group_rekey_disabled']);
    expect(findings.map((f) => f.severity)).toEqual(['critical', 'high', 'medium', 'low']);
    // Reuse is found across neighbourhoods, but only the caller's radio is named.
    expect(findings[2].radios.map((r) => r.radioId)).toEqual([shared.id]);
    expect(res.body.data.counts).toEqual({ critical: 1, high: 1, medium: 1, low: 1 });
    expect(text).not.toContain(otherNode.name);
    const perRadio = res.body.data.radios.find((r: { radioId: number }) => r.radioId === weak.id);
    expect(perRadio.findings.map((f: { code: string }) => f.code)).toEqual(['psk_weak', 'group_rekey_disabled']);
    expect(perRadio).not.toHaveProperty('preSharedKey');

    const all = await call(admin, 'get', '/api/v1/security-review');
    expect(all.body.data.findings.map((f: { code: string }) => f.code)).toContain('tkip');
    expect(JSON.stringify(all.body)).not.toContain(SHARED);
  });
});
