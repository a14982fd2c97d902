import '@testing-library/jest-dom/vitest';

import { cleanup, configure } from '@testing-library/react';
import { afterAll, afterEach, beforeAll, vi } from 'vitest';

// Fluent inserts its styles on first render, which jsdom parses slowly; when every project runs at
// once the default 1 s wait for findBy* is too tight.
configure({ asyncUtilTimeout: 3_000 });

afterEach(() => {
  cleanup();
  vi.restoreAllMocks();
});

// Test files share a worker (the web project runs with isolate: false): each file starts with empty
// storage and ends with real timers and no stubbed globals, whatever the previous file did.
beforeAll(() => {
  localStorage.clear();
  sessionStorage.clear();
});
afterAll(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

// jsdom has no matchMedia; the theme follows it, so answer "light" and never change.
if (typeof window.matchMedia !== 'function') {
  Object.defineProperty(window, 'matchMedia', {
    writable: true,
    value: (query: string): MediaQueryList => ({
      matches: false,
      media: query,
      onchange: null,
      addEventListener: () => undefined,
      removeEventListener: () => undefined,
      addListener: () => undefined,
      removeListener: () => undefined,
      dispatchEvent: () => false,
    }),
  });
}

// jsdom has no ResizeObserver; Fluent's MessageBar measures itself with one. Nothing ever resizes here.
if (typeof window.ResizeObserver !== 'function') {
  class NoResizeObserver {
    observe(): void {}
    unobserve(): void {}
    disconnect(): void {}
  }
  Object.defineProperty(window, 'ResizeObserver', { writable: true, value: NoResizeObserver });
}

// jsdom lays nothing out: offsetParent is null for every element and the body measures 0 x 0, which
// Tabster (Fluent's focus manager) reads as "display: none" and "in a hidden frame". It then finds
// nothing focusable in an opened dialog, Fluent focuses the dialog's surface instead of its first field
// (a browser focuses the field), and Tabster, which activates a modal only when focus lands inside it,
// hides the open dialog with aria-hidden 250 ms later (a test that took longer than that to reach the
// dialog's field failed). Here an element in the page outside any `hidden` element has its parent as
// offsetParent, and the body measures as the window does.
Object.defineProperty(HTMLElement.prototype, 'offsetParent', {
  configurable: true,
  get(this: HTMLElement): Element | null {
    if (!this.isConnected || this === this.ownerDocument.body || this.closest('[hidden]')) return null;
    return this.parentElement;
  },
});
HTMLBodyElement.prototype.getBoundingClientRect = function bodyRect(this: HTMLBodyElement): DOMRect {
  return new DOMRect(0, 0, window.innerWidth, window.innerHeight);
};

// jsdom's Blob (and File) has no arrayBuffer(); the photo picker reads a file's first bytes with it to
// tell HEIC from JPEG. FileReader, which jsdom has, gives the same bytes.
if (typeof Blob.prototype.arrayBuffer !== 'function') {
  Object.defineProperty(Blob.prototype, 'arrayBuffer', {
    writable: true,
    configurable: true,
    value(this: Blob): Promise<ArrayBuffer> {
      return new Promise((resolve, reject) => {
        const reader = new FileReader();
        reader.onload = () => resolve(reader.result as ArrayBuffer);
        reader.onerror = () => reject(reader.error ?? new Error('the file could not be read'));
        reader.readAsArrayBuffer(this);
      });
    },
  });
  // Node's fetch takes a Blob with arrayBuffer() for a real one and reads it through stream(): a mocked
  // Response built on a jsdom Blob (an image answer) needs that as well.
  Object.defineProperty(Blob.prototype, 'stream', {
    writable: true,
    configurable: true,
    value(this: Blob): ReadableStream<Uint8Array> {
      const bytes = this.arrayBuffer();
      return new ReadableStream<Uint8Array>({
        async start(controller) {
          controller.enqueue(new Uint8Array(await bytes));
          controller.close();
        },
      });
    },
  });
}

// Fluent's styles are thousands of one-declaration rules, and jsdom matches every rule's selector
// against every element whose style is asked for: the accessible-name and visibility checks behind
// getByRole asked for so many that they took 40 % of the item form spec's CPU. jsdom lays nothing out,
// so the only styles a test can observe are those that hide or disable: a Fluent rule is kept when it
// sets display, visibility, opacity (jest-dom's toBeVisible), pointer-events (user-event refuses to
// click through `none`) or content; every other style rule (colours, spacing, fonts) is left out of
// the page. At-rules are kept as they are (jsdom skips media queries other than plain "screen").
const STYLE_A_TEST_CAN_SEE = /[{;]\s*(?:display|visibility|opacity|pointer-events|content)\s*:/;
const styleProbe = document.createElement('style');
document.head.append(styleProbe);
const sheetPrototype = Object.getPrototypeOf(styleProbe.sheet) as CSSStyleSheet & { loamlineFiltered?: boolean };
styleProbe.remove();
if (!sheetPrototype.loamlineFiltered) {
  const insertRule = sheetPrototype.insertRule;
  sheetPrototype.insertRule = function insertVisibleRule(this: CSSStyleSheet, rule: string, index?: number): number {
    const isStyleRule = !rule.trimStart().startsWith('@');
    if (isStyleRule && !STYLE_A_TEST_CAN_SEE.test(rule)) return index ?? 0;
    return insertRule.call(this, rule, index);
  };
  sheetPrototype.loamlineFiltered = true;
}
