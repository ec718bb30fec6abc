import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ContactRow, ContactUpdate } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { supplierKeys } from './keys.ts';

export function updateContact({ supplierId, contactId, ...body }: ContactUpdate & { supplierId: number; contactId: number }): Promise<ContactRow> {
  return apiClient.patch<ContactRow>(`/api/suppliers/${supplierId}/contacts/${contactId}`, { ...body });
}

export function useUpdateContact(supplierId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ contactId, ...body }: ContactUpdate & { contactId: number }) => updateContact({ supplierId, contactId, ...body }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: supplierKeys.detail(supplierId) }),
  });
}
