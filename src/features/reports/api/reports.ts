import { useQuery } from '@tanstack/react-query';
import type { AvailabilityReportDto } from '../../../../shared/schemas/report';
import { api } from '../../../lib/api';

export const reportKeys = { availability: (month: string) => ['reports', 'availability', month] as const };

export function useAvailabilityReport(month: string) {
  return useQuery({
    queryKey: reportKeys.availability(month),
    queryFn: () => api.get<{ data: AvailabilityReportDto }>('/reports/availability', { month }).then((r) => r.data),
  });
}

export const reportCsvUrl = (month: string, table: 'availability' | 'outages') =>
  `/api/v1/reports/availability?month=${encodeURIComponent(month)}&format=csv&table=${table}`;
