/**
 * The page's one piece of state: what is selected (a qubit, an edge or a layer) and how the
 * map colours its edges. Views subscribe and redraw their highlights when it changes.
 */

export type Selected = { kind: 'qubit'; id: string } | { kind: 'edge'; key: string } | { kind: 'layer'; index: number } | null;
export type EdgeColouring = 'layer' | 'error';

export interface StoreState {
  selected: Selected;
  colouring: EdgeColouring;
}

type Listener = (state: StoreState, changed: 'selected' | 'colouring') => void;

export class Store {
  private current: StoreState;
  private readonly listeners: Listener[] = [];

  constructor(initial: StoreState) {
    this.current = initial;
  }

  get state(): StoreState {
    return this.current;
  }

  subscribe(listener: Listener): void {
    this.listeners.push(listener);
  }

  select(selected: Selected): void {
    this.current = { ...this.current, selected };
    for (const l of this.listeners) l(this.current, 'selected');
  }

  colourBy(colouring: EdgeColouring): void {
    if (colouring === this.current.colouring) return;
    this.current = { ...this.current, colouring };
    for (const l of this.listeners) l(this.current, 'colouring');
  }
}
