/** The floating one-line summary shown while the pointer is over a qubit, an edge or a row. */

export interface Tooltip {
  show(text: string, clientX: number, clientY: number): void;
  hide(): void;
}

export function tooltipIn(node: HTMLElement): Tooltip {
  return {
    show(text, x, y) {
      if (node.textContent !== text) node.textContent = text;
      node.style.display = 'block';
      const w = node.offsetWidth;
      const left = x + 14 + w > window.innerWidth ? x - 14 - w : x + 14;
      node.style.left = `${Math.max(4, left)}px`;
      node.style.top = `${y + 16}px`;
    },
    hide() {
      node.style.display = 'none';
    },
  };
}
