import { Link } from 'react-router-dom';
import { buttonClasses } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';

export function NotFoundPage() {
  return (
    <>
      <title>Page not found · Rowpath</title>
      <PageHeader title="Page not found" description="There is nothing at this address. The link may be old, or mistyped." />
      <Link to="/" className={buttonClasses('primary')}>
        Go to Home
      </Link>
    </>
  );
}
