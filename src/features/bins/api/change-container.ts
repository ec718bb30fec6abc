import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  AdjustContainerRequest,
  CloseContainerRequest,
  ContainerDetail,
  MoveContainerRequest,
  ScrapContainerRequest,
} from '../../../../shared/api/bins.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { binKeys } from './keys.ts';

export type ContainerChange =
  | { action: 'move'; id: number; body: MoveContainerRequest }
  | { action: 'adjust'; id: number; body: AdjustContainerRequest }
  | { action: 'scrap'; id: number; body: ScrapContainerRequest }
  | { action: 'close'; id: number; body: CloseContainerRequest };

/** POST /api/containers/:id/{move|adjust|scrap|close}: every change answers the container as it now is. */
export function changeContainer(c: ContainerChange): Promise<ContainerDetail> {
  return apiClient.post<ContainerDetail>(`/api/containers/${c.id}/${c.action}`, { ...c.body });
}

export function useChangeContainer() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: changeContainer,
    onSuccess: (detail) => {
      qc.setQueryData(binKeys.container(detail.id), detail);
      void qc.invalidateQueries({ queryKey: binKeys.all });
    },
  });
}
