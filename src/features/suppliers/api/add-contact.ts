import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ContactInput, ContactRow } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { supplierKeys } from './keys.ts';

export function addContact({ supplierId, ...body }: ContactInput & { supplierId: number }): Promise<ContactRow> {
  return apiClient.post<ContactRow>(`/api/suppliers/${supplierId}/contacts`, { ...body });
}

export function useAddContact(supplierId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ContactInput) => addContact({ supplierId, ...body }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: supplierKeys.all }),
  });
}
