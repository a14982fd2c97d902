import { FluentProvider } from '@fluentui/react-components';
import { render, screen } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router';
import { describe, expect, it } from 'vitest';

import { lightTheme } from '../../app/theme';
import { ApiError } from '../../lib/api-client';

import { RouteErrorPage } from './route-error-page';

function renderFailingRoute(error: unknown) {
  const router = createMemoryRouter([
    {
      path: '/',
      loader: () => {
        throw error;
      },
      Component: () => null,
      ErrorBoundary: RouteErrorPage,
      HydrateFallback: () => null,
    },
  ]);
  render(
    <FluentProvider theme={lightTheme}>
      <RouterProvider router={router} />
    </FluentProvider>,
  );
}

describe('RouteErrorPage', () => {
  it('should show the status and message of an ApiError', async () => {
    renderFailingRoute(new ApiError({ status: 500, message: 'Internal server error' }));

    expect(await screen.findByRole('heading', { name: 'This page could not be loaded' })).toBeInTheDocument();
    expect(screen.getByText('The server answered: Internal server error')).toBeInTheDocument();
    expect(screen.getByText('Status 500')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Go to the home page' })).toHaveAttribute('href', '/');
  });

  it('should show a friendly message for an unexpected error', async () => {
    renderFailingRoute(new Error('boom'));

    expect(await screen.findByRole('heading', { name: 'Something went wrong' })).toBeInTheDocument();
    expect(screen.queryByText(/Status/)).not.toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Reload the page' })).toBeInTheDocument();
  });
});
