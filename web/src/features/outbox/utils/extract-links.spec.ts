import { describe, expect, it } from 'vitest';

import { extractLinks } from './extract-links';

describe('extractLinks', () => {
  it('should list anchors and bare URLs once each, in order, without trailing punctuation', () => {
    const html = `<p>Hello</p><a href="http://app.example/accept-invitation?token=abc&amp;x=1">Join</a>
      <a href="mailto:office@quillmoss.example">Write to us</a>`;
    const text = 'Join here: http://app.example/accept-invitation?token=abc&x=1. Or see https://help.example/start.';

    expect(extractLinks({ html, text })).toEqual([
      'http://app.example/accept-invitation?token=abc&x=1',
      'https://help.example/start',
    ]);
  });

  it('should give nothing for a message without links', () => {
    expect(extractLinks({ html: null, text: 'No links here.' })).toEqual([]);
  });
});
