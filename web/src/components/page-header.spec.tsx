import { Badge, FluentProvider } from '@fluentui/react-components';
import { render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';

import { lightTheme } from '../app/theme';

import { PageHeader } from './page-header';

describe('PageHeader', () => {
  afterEach(() => vi.restoreAllMocks());

  it('should put a text description in a paragraph', () => {
    render(
      <FluentProvider theme={lightTheme}>
        <PageHeader title="Settings" description="How lengths are shown." />
      </FluentProvider>,
    );
    expect(screen.getByText('How lengths are shown.').tagName).toBe('P');
  });

  it('should not nest block elements in a paragraph when the description is markup (a status badge is a div)', () => {
    const consoleError = vi.spyOn(console, 'error').mockImplementation(() => undefined);
    render(
      <FluentProvider theme={lightTheme}>
        <PageHeader
          title="Back-yard lights"
          description={
            <span>
              <Badge>In progress</Badge> Maple Court
            </span>
          }
        />
      </FluentProvider>,
    );
    const badge = screen.getByText('In progress');
    expect(badge.closest('p')).toBeNull();
    expect(consoleError.mock.calls.flat().join(' ')).not.toMatch(/cannot (be a descendant of|contain a nested)/);
  });
});
