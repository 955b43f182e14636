import type { Sequelize } from 'sequelize';
import { AlertPreference } from './alertPreference';
import { Link } from './link';
import { MaintenanceWindow } from './maintenanceWindow';
import { Neighbourhood, OperatorAssignment } from './neighbourhood';
import { NetworkSettings } from './networkSettings';
import { Node } from './node';
import { Outage } from './outage';
import { OutboxMessage } from './outboxMessage';
import { Radio } from './radio';
import { Site } from './site';
import { User } from './user';

export { AlertPreference, Link, MaintenanceWindow, Neighbourhood, NetworkSettings, Node, OperatorAssignment, Outage, OutboxMessage, Radio, Site, User };

let initialised: Sequelize | null = null;

/** Binds every model to one Sequelize instance; the schema itself comes from migrations. */
export function initModels(sequelize: Sequelize): void {
  if (initialised === sequelize) return;
  for (const m of [
    User,
    Neighbourhood,
    OperatorAssignment,
    Site,
    Node,
    Radio,
    Link,
    NetworkSettings,
    Outage,
    OutboxMessage,
    MaintenanceWindow,
    AlertPreference,
  ])
    m.initModel(sequelize);
  MaintenanceWindow.belongsTo(User, { as: 'creator', foreignKey: 'createdBy' });
  Site.belongsTo(User, { as: 'host', foreignKey: 'hostUserId' });
  Radio.belongsTo(Node, { as: 'node', foreignKey: 'nodeId' });
  Outage.belongsTo(Node, { as: 'node', foreignKey: 'nodeId' });
  Outage.belongsTo(User, { as: 'acknowledger', foreignKey: 'acknowledgedBy' });
  Link.belongsTo(Radio, { as: 'radioA', foreignKey: 'radioAId' });
  Link.belongsTo(Radio, { as: 'radioB', foreignKey: 'radioBId' });
  initialised = sequelize;
}
