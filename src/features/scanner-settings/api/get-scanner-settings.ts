import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ScannerSettingsResponse } from '../../../../shared/api/settings.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { scannerSettingsKeys } from './keys.ts';

export function getScannerSettings(): Promise<ScannerSettingsResponse> {
  return apiClient.get<ScannerSettingsResponse>('/api/settings/scanner');
}

export const scannerSettingsQueryOptions = () => queryOptions({ queryKey: scannerSettingsKeys.all, queryFn: getScannerSettings });

export function useScannerSettings() {
  return useQuery(scannerSettingsQueryOptions());
}
