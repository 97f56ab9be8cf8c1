import { Link } from 'react-router-dom';
import { buttonVariants } from '../../components/ui/button';
import { EmptyState } from '../../components/ui/states';
import { paths } from '../paths';

/** Any signed-in address that matches no page. */
export function NotFoundRoute() {
  return (
    <EmptyState
      title="Page not found"
      action={
        <Link to={paths.cases} className={buttonVariants({ variant: 'outline', size: 'sm' })}>
          Go to Cases
        </Link>
      }
    >
      There is no page at this address. Use the navigation on the left to find your way.
    </EmptyState>
  );
}
