import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ScannerSettings, ScannerSettingsResponse } from '../../../../shared/api/settings.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { scannerSettingsKeys } from './keys.ts';

export function updateScannerSettings(body: ScannerSettings): Promise<ScannerSettingsResponse> {
  return apiClient.put<ScannerSettingsResponse>('/api/settings/scanner', { ...body });
}

export function useUpdateScannerSettings() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateScannerSettings, onSuccess: (data) => qc.setQueryData(scannerSettingsKeys.all, data) });
}
