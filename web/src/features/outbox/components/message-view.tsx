import { makeStyles, Tab, TabList, Text, tokens } from '@fluentui/react-components';
import { Fragment, useMemo, useState } from 'react';
import type { OutboxMessageResponse } from '@domain/mail/outbox.schema';

import { formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { extractLinks } from '../utils/extract-links';

import { MessageAttachments } from './message-attachments';
import { MessageLinks } from './message-links';
import { PREVIEW_PAPER } from '../../../config/canvas-theme';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXL },
  meta: {
    margin: 0,
    display: 'grid',
    gridTemplateColumns: 'auto minmax(0, 1fr)',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalS,
    padding: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  term: { color: tokens.colorNeutralForeground2 },
  value: { margin: 0, overflowWrap: 'anywhere' },
  section: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  sectionTitle: { margin: 0 },
  body: {
    borderRadius: tokens.borderRadiusLarge,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
    overflow: 'hidden',
    backgroundColor: tokens.colorNeutralBackground1,
  },
  tabs: { borderBottom: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}` },
  tab: { minHeight: '48px' },
  frame: {
    display: 'block',
    width: '100%',
    height: '70dvh',
    minHeight: '20rem',
    border: 'none',
    // Mail is written for a white page whatever the app's theme.
    backgroundColor: PREVIEW_PAPER,
  },
  text: {
    margin: 0,
    padding: tokens.spacingHorizontalL,
    whiteSpace: 'pre-wrap',
    overflowWrap: 'anywhere',
    fontFamily: tokens.fontFamilyMonospace,
    fontSize: tokens.fontSizeBase300,
    lineHeight: tokens.lineHeightBase400,
  },
  headers: {
    margin: 0,
    padding: tokens.spacingHorizontalL,
    display: 'grid',
    gridTemplateColumns: 'minmax(0, max-content) minmax(0, 1fr)',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalXS,
    fontSize: tokens.fontSizeBase200,
  },
  headerName: { fontWeight: tokens.fontWeightSemibold, overflowWrap: 'anywhere' },
  headerValue: { margin: 0, overflowWrap: 'anywhere' },
  empty: { margin: 0, padding: tokens.spacingHorizontalL, color: tokens.colorNeutralForeground2 },
});

type BodyTab = 'html' | 'text' | 'headers';

/** One captured message: who and when, its links and attachments, and the body as HTML or text. */
export function MessageView({ message }: { message: OutboxMessageResponse }) {
  const dateStyle = useDateStyle();
  const styles = useStyles();
  const [tab, setTab] = useState<BodyTab>(message.html ? 'html' : 'text');
  const links = useMemo(() => extractLinks(message), [message]);

  return (
    <div className={styles.root}>
      <dl className={styles.meta}>
        <dt className={styles.term}>From</dt>
        <dd className={styles.value}>{message.from}</dd>
        <dt className={styles.term}>To</dt>
        <dd className={styles.value}>{message.to.join(', ')}</dd>
        <dt className={styles.term}>Received</dt>
        <dd className={styles.value}>
          <time dateTime={message.receivedAt}>{formatDateTime(message.receivedAt, dateStyle)}</time>
        </dd>
      </dl>

      <section className={styles.section} aria-labelledby="message-links">
        <Text as="h3" id="message-links" size={500} weight="semibold" className={styles.sectionTitle}>
          Links in this message
        </Text>
        <MessageLinks links={links} />
      </section>

      {message.attachments.length > 0 && (
        <section className={styles.section} aria-labelledby="message-attachments">
          <Text as="h3" id="message-attachments" size={500} weight="semibold" className={styles.sectionTitle}>
            Attachments
          </Text>
          <MessageAttachments messageId={message.id} attachments={message.attachments} />
        </section>
      )}

      <section className={styles.section} aria-labelledby="message-body">
        <Text as="h3" id="message-body" size={500} weight="semibold" className={styles.sectionTitle}>
          Message
        </Text>
        <div className={styles.body}>
          <TabList
            className={styles.tabs}
            selectedValue={tab}
            onTabSelect={(_event, data) => setTab(data.value as BodyTab)}
          >
            <Tab value="html" className={styles.tab} disabled={!message.html}>
              Formatted
            </Tab>
            <Tab value="text" className={styles.tab}>
              Plain text
            </Tab>
            <Tab value="headers" className={styles.tab}>
              Headers
            </Tab>
          </TabList>
          {tab === 'html' && message.html && (
            // sandbox="" : no scripts, no forms, no navigation, no same-origin access — mail is untrusted.
            <iframe title="The message as formatted" sandbox="" srcDoc={message.html} className={styles.frame} />
          )}
          {tab === 'text' &&
            (message.text ? (
              <pre className={styles.text}>{message.text}</pre>
            ) : (
              <p className={styles.empty}>This message has no plain-text part.</p>
            ))}
          {tab === 'headers' && (
            <dl className={styles.headers}>
              {Object.entries(message.headers).map(([name, value]) => (
                <Fragment key={name}>
                  <dt className={styles.headerName}>{name}</dt>
                  <dd className={styles.headerValue}>{value}</dd>
                </Fragment>
              ))}
            </dl>
          )}
        </div>
      </section>
    </div>
  );
}
