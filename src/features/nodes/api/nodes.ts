import type { z } from 'zod';
import type { NodeDto, nodeCreateSchema, nodeUpdateSchema } from '../../../../shared/schemas/node';
import { neighbourhoodKeys, nodeKeys, overviewKeys, topologyKeys } from '../../../lib/query-keys';
import { resourceHooks } from '../../../lib/resource';

type NodeCreate = z.output<typeof nodeCreateSchema>;
type NodeUpdate = z.output<typeof nodeUpdateSchema>;

// Node counts by state show on the overview and per neighbourhood; nodes are drawn on the map.
const nodes = resourceHooks<NodeDto, NodeCreate, NodeUpdate>('/nodes', nodeKeys, [overviewKeys.all, neighbourhoodKeys.all, topologyKeys.all]);

export const useNodes = nodes.useList;
export const useNode = nodes.useOne;
export const useCreateNode = nodes.useCreate;
export const useUpdateNode = nodes.useUpdate;
export const useDeleteNode = nodes.useRemove;
