import { Component, type ReactNode } from 'react';
import { ErrorState } from './states';

interface Props {
  /** Heading of the message shown instead of the children. */
  title: string;
  children: ReactNode;
}

/** Catches a render error of one panel (a chart) so the rest of the page keeps working (STYLE.md §9). */
export class ErrorBoundary extends Component<Props, { error: Error | null }> {
  state = { error: null as Error | null };

  static getDerivedStateFromError(error: Error) {
    return { error };
  }

  render() {
    if (this.state.error) {
      return (
        <ErrorState title={this.props.title}>
          {this.state.error.message} — reload the page; if it happens again, download the data (CSV) and tell whoever looks after Crankwise.
        </ErrorState>
      );
    }
    return this.props.children;
  }
}
