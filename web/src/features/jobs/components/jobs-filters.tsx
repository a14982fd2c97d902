import { Combobox, Field, makeStyles, Option, SearchBox, Select, Tab, TabList, tokens } from '@fluentui/react-components';
import { useEffect, useState } from 'react';

import type { JobListParams } from '../api/get-jobs';
import { JOB_STATUS_TEXT, JOB_STATUSES } from '../utils/job-status';

const useStyles = makeStyles({
  root: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'flex-end',
    gap: `${tokens.spacingVerticalM} ${tokens.spacingHorizontalL}`,
    marginBlockEnd: tokens.spacingVerticalL,
  },
  search: { flex: '2 1 16rem', minWidth: 0 },
  searchBox: { width: '100%', maxWidth: 'none', minHeight: '48px' },
  select: { flex: '1 1 12rem', minWidth: 0 },
  control: { minHeight: '48px', '& select': { height: '48px', minHeight: '48px' }, '& .fui-Combobox__expandIcon': { minWidth: '44px', minHeight: '44px', display: 'inline-flex', alignItems: 'center', justifyContent: 'center' } },
  tabs: { flex: '1 1 100%' },
  tab: { minHeight: '48px' },
});

const SORT_CHOICES = [
  { value: '-updatedAt', label: 'Last changed first' },
  { value: 'title', label: 'Job title A–Z' },
  { value: 'site', label: 'Site A–Z' },
  { value: 'customer', label: 'Customer A–Z' },
  { value: 'status', label: 'Status' },
  { value: 'startDate', label: 'Start date' },
];

type JobsFiltersProps = {
  params: JobListParams;
  onChange: (changes: Partial<JobListParams>) => void;
  /** A phone has no sortable column headers: offer the sort as a choice. */
  showSort: boolean;
};

/** Search, "my jobs / all jobs", any number of statuses and (on a phone) sort for the jobs list. */
export function JobsFilters({ params, onChange, showSort }: JobsFiltersProps) {
  const styles = useStyles();
  const [text, setText] = useState(params.q);

  // Typing waits for a short pause before asking the server.
  useEffect(() => {
    if (text.trim() === params.q.trim()) return;
    const timer = window.setTimeout(() => onChange({ q: text, page: 1 }), 350);
    return () => window.clearTimeout(timer);
  }, [onChange, params.q, text]);

  useEffect(() => setText(params.q), [params.q]);

  return (
    <div className={styles.root} role="search" aria-label="Find jobs">
      <TabList
        className={styles.tabs}
        selectedValue={params.mine ? 'mine' : 'all'}
        onTabSelect={(_event, data) => onChange({ mine: data.value === 'mine', page: 1 })}
        aria-label="Whose jobs"
      >
        <Tab value="mine" className={styles.tab}>
          My jobs
        </Tab>
        <Tab value="all" className={styles.tab}>
          All jobs
        </Tab>
      </TabList>
      <Field label="Search" className={styles.search}>
        <SearchBox
          className={styles.searchBox}
          placeholder="Job, site, address or customer"
          value={text}
          onChange={(_event, data) => setText(data.value)}
        />
      </Field>
      <Field label="Status" className={styles.select}>
        {/* Fluent's clear button does not work with multiselect: ticking the statuses off again clears it. */}
        <Combobox
          multiselect
          className={styles.control}
          placeholder="Any status"
          selectedOptions={params.status}
          value={params.status.map((status) => JOB_STATUS_TEXT[status]).join(', ')}
          onOptionSelect={(_event, data) => onChange({ status: JOB_STATUSES.filter((s) => data.selectedOptions.includes(s)), page: 1 })}
        >
          {JOB_STATUSES.map((status) => (
            <Option key={status} value={status}>
              {JOB_STATUS_TEXT[status]}
            </Option>
          ))}
        </Combobox>
      </Field>
      {showSort && (
        <Field label="Sort" className={styles.select}>
          <Select className={styles.control} value={params.sort} onChange={(_event, data) => onChange({ sort: data.value, page: 1 })}>
            {SORT_CHOICES.map((choice) => (
              <option key={choice.value} value={choice.value}>
                {choice.label}
              </option>
            ))}
          </Select>
        </Field>
      )}
    </div>
  );
}
