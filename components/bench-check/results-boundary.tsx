'use client';
import { Component, type ReactNode } from 'react';

type Props = { children: ReactNode; /** A change (the typed form) clears the error and tries again. */ resetKey: string; what: string };
type State = { failed: boolean; key: string };

/**
 * Keeps a fault in one part of the page from taking the rest with it. The form's state lives above this
 * boundary, so everything typed stays; the next keystroke tries again.
 */
export class ResultsBoundary extends Component<Props, State> {
  state: State = { failed: false, key: this.props.resetKey };

  static getDerivedStateFromError(): Partial<State> {
    return { failed: true };
  }

  static getDerivedStateFromProps(props: Props, state: State): Partial<State> | null {
    return props.resetKey !== state.key ? { failed: false, key: props.resetKey } : null;
  }

  componentDidCatch(error: unknown) {
    console.error(`bench-check: the ${this.props.what} could not be drawn`, error);
  }

  render() {
    if (!this.state.failed) return this.props.children;
    return (
      <section role="alert" className="card border-2 border-red-700 dark:border-red-400">
        <h2 className="text-lg font-bold">The {this.props.what} could not be shown for these values</h2>
        <p className="mt-1 text-sm">
          Everything you typed is kept. Change a value to try again; if it keeps happening with sensible values, tell a steward which
          values you entered.
        </p>
      </section>
    );
  }
}
