import { createContext, useContext } from 'react';

import type { FieldTarget } from '../utils/finding-target';

type WorkspaceFocus = {
  /** The field a finding link asked for; the record showing it opens its editor. */
  target: FieldTarget | undefined;
  focus: (target: FieldTarget) => void;
};

export const WorkspaceFocusContext = createContext<WorkspaceFocus>({ target: undefined, focus: () => undefined });

export function useWorkspaceFocus(): WorkspaceFocus {
  return useContext(WorkspaceFocusContext);
}
