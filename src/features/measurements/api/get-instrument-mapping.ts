import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InstrumentMappingResponse } from '../../../../shared/api/measurements.ts';
import { ApiError, apiClient } from '../../../lib/api-client.ts';
import { measurementKeys } from './keys.ts';

/** The mapping last used with an instrument, or null when none is remembered yet. */
export async function getInstrumentMapping(instrument: string): Promise<InstrumentMappingResponse | null> {
  try {
    return await apiClient.get<InstrumentMappingResponse>(`/api/instrument-mappings/${encodeURIComponent(instrument)}`);
  } catch (e) {
    if (e instanceof ApiError && e.status === 404) return null;
    throw e;
  }
}

export const instrumentMappingQueryOptions = (instrument: string) =>
  queryOptions({ queryKey: measurementKeys.mapping(instrument), queryFn: () => getInstrumentMapping(instrument), staleTime: 60_000 });

export function useInstrumentMapping(instrument: string | null) {
  return useQuery({ ...instrumentMappingQueryOptions(instrument ?? ''), enabled: Boolean(instrument) });
}
