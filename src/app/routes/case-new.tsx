import { useSuspenseQuery } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { Card, CardContent } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { NewCaseForm } from '../../features/cases/components/new-case-form';
import { paths } from '../paths';

/** New case: the form, then the new case's page. */
export function CaseNewRoute() {
  const navigate = useNavigate();
  const { data } = useSuspenseQuery(meQueryOptions());
  const shop = data.user.shop as { advisorName?: string | null; advisorEmail?: string | null };
  return (
    <>
      <PageHeader title="New case" description="Open a case for a repair order. The engine decides which parts can be suspected." />
      <Card><CardContent className="pt-5">
        <NewCaseForm me={data.user} advisorDefaults={{ name: shop.advisorName, email: shop.advisorEmail }}
          onCreated={(c) => navigate(paths.case(c.id))} onCancel={() => navigate(paths.cases)} />
      </CardContent></Card>
    </>
  );
}
