/**
 * Full page loads, for addresses the app's router does not serve: the sign-in page is a page of its own
 * (web/sign-in.html, issue 17). An object so that a spec can spy on it (jsdom does not navigate).
 */
export const pageLoad = {
  /** Loads `url` in place of the current page (Back does not return to it). */
  replace(url: string): void {
    window.location.replace(url);
  },
};
