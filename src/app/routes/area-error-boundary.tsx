import { Component, type ErrorInfo, type ReactNode } from 'react';
import type { Area } from '@shared/schema/role-names';
import { EmptyState } from '../../components/ui/card';
import { Button, LinkButton } from '../../components/ui/button';
import { ApiError } from '../../lib/api-client';

const AREA_NAME: Record<Area, string> = { bench: 'Bench', drafting: 'Drafting', debrief: 'Debrief', shop: 'Shop' };

interface Props { area: Area; /** a new value (the address) clears the failure */ resetKey: string; children: ReactNode }
interface State { error: Error | null; resetKey: string }

/**
 * One per area: a screen that fails to draw shows what happened and a way back to the area's
 * home, instead of a blank page; the rest of the app (and the other areas) keep working.
 */
export class AreaErrorBoundary extends Component<Props, State> {
  override state: State = { error: null, resetKey: this.props.resetKey };

  static getDerivedStateFromError(error: unknown): Partial<State> {
    return { error: error instanceof Error ? error : new Error(String(error)) };
  }

  static getDerivedStateFromProps(props: Props, state: State): Partial<State> | null {
    return props.resetKey === state.resetKey ? null : { error: null, resetKey: props.resetKey };
  }

  override componentDidCatch(error: unknown, info: ErrorInfo): void {
    console.warn(`[${this.props.area}] a screen failed to draw`, error, info.componentStack);
  }

  override render(): ReactNode {
    const { error } = this.state;
    if (!error) return this.props.children;
    const name = AREA_NAME[this.props.area];
    return (
      <div role="alert">
        <EmptyState title={`This ${name} screen could not be shown`}>
          {/* the server's words say what to do (and a 500's request id); a script error's would not */}
          <p>{error instanceof ApiError ? error.message : 'Something went wrong while drawing it. Try again; if it keeps happening, tell your lead which screen it was.'}</p>
          {this.props.area === 'bench' && <p className="mt-2">Answers already saved stay on this phone and keep syncing.</p>}
          <div className="mt-4 flex flex-wrap justify-center gap-3">
            <LinkButton to={`/${this.props.area}`} className="min-h-12">Back to {name}</LinkButton>
            <Button variant="secondary" className="min-h-12" onClick={() => this.setState({ error: null })}>Try again</Button>
          </div>
        </EmptyState>
      </div>
    );
  }
}
