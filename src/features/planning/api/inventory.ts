import { useQuery } from '@tanstack/react-query';
import type { LinkDto } from '../../../../shared/schemas/link';
import { linkKeys } from '../../../lib/query-keys';
import { listQuery, rowsOf } from '../../../lib/resource';

// The inventory pickers of the planning pages read the same list queries as the inventory pages
// (the envelope under the key, narrowed to rows with `select`).
export { useNodeChoices, useRadioChoices, useSiteChoices } from '../../../lib/inventory-choices';

export const useLiveLinks = () => {
  const params = { page: 1, pageSize: 500, sort: 'name', status: 'live' };
  return useQuery({ ...listQuery<LinkDto>('/links', linkKeys, params), select: rowsOf });
};
