import { Link, Navigate, useParams } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice.tsx';
import { Loading } from '../../../components/ui/page.tsx';
import { useContainerByCode } from '../../../features/bins/api/get-container-by-code.ts';
import { RequireArea } from '../require-area.tsx';

/** /bins/containers/code/:code — opens the container a scanned code names (from any scan field). */
export function ContainerCodePage() {
  const code = useParams().code ?? '';
  const q = useContainerByCode(code);
  return (
    <RequireArea area="bins">
      {q.isLoading ? (
        <Loading label={`Looking up ${code}…`} />
      ) : q.data ? (
        <Navigate to={`/bins/containers/${q.data.id}`} replace />
      ) : (
        <Notice tone="fail" title={`No container ${code}`}>
          {(q.error as Error | null)?.message}{' '}
          <Link to="/bins" className="font-semibold underline">
            Back to Bins
          </Link>
        </Notice>
      )}
    </RequireArea>
  );
}
