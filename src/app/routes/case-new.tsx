import { useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { Card, CardContent } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { caseShopQueryOptions } from '../../features/cases/api/case-queries';
import { NewCaseForm } from '../../features/cases/components/new-case-form';
import { LoadingState } from '../../components/ui/spinner';
import { paths } from '../paths';

/** New case: the form, then the new case's page. */
export function CaseNewRoute() {
  const navigate = useNavigate();
  const { data } = useSuspenseQuery(meQueryOptions());
  // The shop's defaults (Shop setup): the usual lead and service advisor's e-mail; none when unset.
  const shop = useQuery(caseShopQueryOptions());
  return (
    <>
      <PageHeader title="New case" description="Open a case for a repair order. The engine decides which parts can be suspected." />
      <Card><CardContent className="pt-5">
        {shop.isPending ? <LoadingState /> : <NewCaseForm me={data.user} advisorDefaults={{ email: shop.data?.serviceAdvisorEmail, leadId: shop.data?.defaultLeadId ?? null }}
          onCreated={(c) => navigate(paths.case(c.id))} onCancel={() => navigate(paths.cases)} />}
      </CardContent></Card>
    </>
  );
}
