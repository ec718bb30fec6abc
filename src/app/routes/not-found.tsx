import { Link } from 'react-router-dom';
import { EmptyState, PageHeader } from '../../components/ui/page.tsx';

export function NotFoundPage() {
  return (
    <>
      <PageHeader title="Page not found" />
      <EmptyState title="There is no page at this address">
        <Link to="/" className="font-semibold text-copper-dark underline">
          Go to your start page
        </Link>
      </EmptyState>
    </>
  );
}
