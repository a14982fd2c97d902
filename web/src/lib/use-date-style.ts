import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import type { DateStyle } from '@domain/format/date-time';

import { companyDateStyle } from './format-date';
import { useSessionUser } from './session';
import { getMyPreferencesQueryOptions } from './use-unit-preferences';

/** {@link companyDateStyle} for the signed-in person's company (the preferences query the units use too). */
export function useDateStyle(): DateStyle {
  const user = useSessionUser();
  const { data } = useQuery({ ...getMyPreferencesQueryOptions(), enabled: user !== undefined });
  const company = data?.company;
  return useMemo(() => companyDateStyle(company), [company]);
}
