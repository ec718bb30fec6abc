import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client.ts';
import { supplierKeys } from './keys.ts';

export function deleteContact({ supplierId, contactId }: { supplierId: number; contactId: number }): Promise<void> {
  return apiClient.delete<void>(`/api/suppliers/${supplierId}/contacts/${contactId}`);
}

export function useDeleteContact(supplierId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (contactId: number) => deleteContact({ supplierId, contactId }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: supplierKeys.all }),
  });
}
