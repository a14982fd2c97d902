import { useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import type { DateStyle } from '@domain/format/date-time';

import { readerDateStyle } from './format-date';
import { useSessionUser } from './session';
import { getMyPreferencesQueryOptions } from './use-unit-preferences';

/**
 * The zone and locale screens write dates in: the company's (its profile, sent to everyone of the
 * company with their preferences), as the packet, e-mails and CSV write them, so the office in one zone
 * and a technician's phone set to another read the same day. A company that has not chosen a zone yet,
 * and anyone before the server has answered or signed out, gets the browser's zone.
 */
export function companyDateStyle(company: { timeZone: string | null; locale: string } | undefined, reader: DateStyle = readerDateStyle()): DateStyle {
  if (!company) return reader;
  return { timeZone: company.timeZone ?? reader.timeZone ?? null, locale: company.locale };
}

/** {@link companyDateStyle} for the signed-in person's company (the preferences query the units use too). */
export function useDateStyle(): DateStyle {
  const user = useSessionUser();
  const { data } = useQuery({ ...getMyPreferencesQueryOptions(), enabled: user !== undefined });
  const company = data?.company;
  return useMemo(() => companyDateStyle(company), [company]);
}
