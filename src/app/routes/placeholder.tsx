import type { ReactNode } from 'react';
import { Badge } from '../../components/ui/badge';
import { PageHeader } from '../../components/ui/page-header';
import { EmptyState } from '../../components/ui/states';

export interface PlaceholderProps {
  title: string;
  description: string;
  emptyTitle: string;
  children: ReactNode;
  icon?: ReactNode;
  after?: ReactNode;
}

/** A page whose screen arrives with a later piece of work: says plainly what will be here. */
export function PlaceholderPage({ title, description, emptyTitle, children, icon, after }: PlaceholderProps) {
  return (
    <>
      <PageHeader title={title} description={description} actions={<Badge variant="outline">Coming next</Badge>} />
      <EmptyState title={emptyTitle} icon={icon}>
        {children}
      </EmptyState>
      {after ? <div className="mt-6">{after}</div> : null}
    </>
  );
}
