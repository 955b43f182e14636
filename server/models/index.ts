import type { Sequelize } from 'sequelize';
import { Link } from './link';
import { Neighbourhood, OperatorAssignment } from './neighbourhood';
import { NetworkSettings } from './networkSettings';
import { Node } from './node';
import { Radio } from './radio';
import { Site } from './site';
import { User } from './user';

export { Link, Neighbourhood, NetworkSettings, Node, OperatorAssignment, Radio, Site, User };

let initialised: Sequelize | null = null;

/** Binds every model to one Sequelize instance; the schema itself comes from migrations. */
export function initModels(sequelize: Sequelize): void {
  if (initialised === sequelize) return;
  for (const m of [User, Neighbourhood, OperatorAssignment, Site, Node, Radio, Link, NetworkSettings]) m.initModel(sequelize);
  Site.belongsTo(User, { as: 'host', foreignKey: 'hostUserId' });
  Radio.belongsTo(Node, { as: 'node', foreignKey: 'nodeId' });
  Link.belongsTo(Radio, { as: 'radioA', foreignKey: 'radioAId' });
  Link.belongsTo(Radio, { as: 'radioB', foreignKey: 'radioBId' });
  initialised = sequelize;
}
