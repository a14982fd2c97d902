import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';

import { renderApp } from '../../testing/render-app';

describe('NotFoundRoute', () => {
  it('should show a not-found page with a way home for an unknown address', async () => {
    const { user, router } = renderApp({ url: '/no-such-page' });

    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeInTheDocument();
    await user.click(screen.getByRole('link', { name: 'Go to the home page' }));

    expect(await screen.findByRole('heading', { name: 'Today' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/');
  });
});
