import { Link } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header';
import { Card, CardContent } from '../../components/ui/card';
import { CasesTable } from '../../features/cases/components/cases-table';
import { paths } from '../paths';

/** Cases: one per repair order (docs/design.md "Domain model"), filtered, searched, sorted and paged. */
export function CasesRoute() {
  return (
    <>
      <PageHeader
        title="Cases"
        description="One case per repair order: the vehicle, the complaint, its captures, the ranked suspects and the sign-off."
        actions={<Link to={paths.caseNew} className="inline-flex h-9 items-center rounded-md bg-primary px-4 text-sm font-medium text-primary-foreground shadow-sm hover:bg-primary/90">New case</Link>}
      />
      <Card><CardContent className="pt-5"><CasesTable casePath={paths.case} /></CardContent></Card>
    </>
  );
}
