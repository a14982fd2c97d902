import { Button, Field, Input, makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import SignaturePad from 'signature_pad';
import type { SignatureRole } from '@domain/packet/signature.schema';

import { describeRequestError } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format-date';
import { useDateStyle } from '../../../lib/use-date-style';
import { getJobSignaturesQueryOptions, useJobSignatures, type JobSignatureResponse } from '../api/get-job-signatures';
import { useJobWriter } from '../hooks/job-writer';

import { useCardStyles } from '../../../components/card-styles';
import { SIGNATURE_INK } from '../../../config/canvas-theme';

/** The box the packet prints signatures in (SVG user units). */
const BOX = { width: 400, height: 120 };

const useStyles = makeStyles({
  pads: { display: 'grid', gap: tokens.spacingVerticalL, '@media (min-width: 720px)': { gridTemplateColumns: '1fr 1fr' } },
  pad: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  // A finger-sized field, as in the app's forms.
  name: { minHeight: '48px' },
  canvas: {
    width: '100%',
    aspectRatio: `${BOX.width} / ${BOX.height}`,
    touchAction: 'none',
    border: `1px solid ${tokens.colorNeutralStroke1}`,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground1,
    // A signing line, as on paper (the pad itself is transparent, so this shows through).
    backgroundImage: `linear-gradient(to bottom, transparent 76%, ${tokens.colorNeutralStroke2} 76%, ${tokens.colorNeutralStroke2} calc(76% + 1px), transparent calc(76% + 1px))`,
  },
  hint: { color: tokens.colorNeutralForeground3 },
  preview: { width: '100%', aspectRatio: `${BOX.width} / ${BOX.height}`, border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusMedium },
  error: { color: tokens.colorPaletteRedForeground1 },
  action: { minHeight: '44px' },
});

const ROLE_LABELS: Record<SignatureRole, string> = { lead: 'Crew lead', homeowner: 'Homeowner' };

/** SVG path data (M/L only) of the strokes drawn on the pad, scaled into the 400 × 120 print box. */
export function strokesToPath(groups: readonly { points: readonly { x: number; y: number }[] }[], width: number, height: number): string {
  const sx = BOX.width / (width || BOX.width);
  const sy = BOX.height / (height || BOX.height);
  const n = (v: number) => String(Math.round(v * 10) / 10);
  return groups
    .filter((g) => g.points.length > 0)
    .map((g) => {
      const [first, ...rest] = g.points.map((p) => `${n(p.x * sx)} ${n(p.y * sy)}`);
      // A tap is a dot: draw a tiny line so it shows.
      return rest.length === 0 ? `M ${first} l 0.5 0` : `M ${first} L ${rest.join(' ')}`;
    })
    .join(' ');
}

type SignOffCardProps = { jobId: string; canSign: boolean; crewLeadName: string; homeownerName: string };

/** The walkthrough sign-off: the crew lead and the homeowner sign with a finger on the lead's device. */
export function SignOffCard({ jobId, canSign, crewLeadName, homeownerName }: SignOffCardProps) {
  const card = useCardStyles();
  const styles = useStyles();
  const signatures = useJobSignatures(jobId);
  return (
    <section className={card.card} aria-labelledby="sign-off-title">
      <Text as="h2" size={500} weight="semibold" id="sign-off-title" className={card.title}>
        Sign-off
      </Text>
      <Text>Signed at the walkthrough; the signatures print in the next packet revision. Unsigned, the packet says in one line that the walkthrough was not signed.</Text>
      {signatures.isPending && <Spinner size="small" label="Loading signatures" />}
      {signatures.isError && <Text className={styles.error}>{describeRequestError(signatures.error)}</Text>}
      {signatures.data && (
        <div className={styles.pads}>
          {(['lead', 'homeowner'] as const).map((role) => (
            <SignaturePadField
              key={role}
              jobId={jobId}
              role={role}
              canSign={canSign}
              defaultName={role === 'lead' ? crewLeadName : homeownerName}
              saved={signatures.data.find((s) => s.role === role)}
            />
          ))}
        </div>
      )}
    </section>
  );
}

type PadFieldProps = { jobId: string; role: SignatureRole; canSign: boolean; defaultName: string; saved: JobSignatureResponse | undefined };

function SignaturePadField({ jobId, role, canSign, defaultName, saved }: PadFieldProps) {
  const styles = useStyles();
  const dateStyle = useDateStyle();
  const card = useCardStyles();
  const queryClient = useQueryClient();
  const { save } = useJobWriter();
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const padRef = useRef<SignaturePad | null>(null);
  const [name, setName] = useState(saved?.signerName ?? defaultName);
  const [isEmpty, setIsEmpty] = useState(true);
  const [isBusy, setIsBusy] = useState(false);
  const [error, setError] = useState<string | undefined>();
  const isDrawing = canSign && !saved;

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!isDrawing || !canvas) return;
    // Draw in device pixels; points stay in CSS pixels.
    const ratio = Math.max(window.devicePixelRatio || 1, 1);
    canvas.width = (canvas.offsetWidth || BOX.width) * ratio;
    canvas.height = (canvas.offsetHeight || BOX.height) * ratio;
    canvas.getContext('2d')?.scale(ratio, ratio);
    const pad = new SignaturePad(canvas, { penColor: SIGNATURE_INK });
    const onEnd = () => setIsEmpty(pad.isEmpty());
    pad.addEventListener('endStroke', onEnd);
    padRef.current = pad;
    return () => {
      pad.removeEventListener('endStroke', onEnd);
      pad.off();
      padRef.current = null;
    };
  }, [isDrawing]);

  const refresh = () => queryClient.invalidateQueries(getJobSignaturesQueryOptions(jobId));

  async function run(work: () => Promise<unknown>) {
    setIsBusy(true);
    setError(undefined);
    try {
      await work();
      await refresh();
    } catch (caught) {
      setError(describeRequestError(caught));
    } finally {
      setIsBusy(false);
    }
  }

  const onSave = () =>
    run(async () => {
      const pad = padRef.current;
      const canvas = canvasRef.current;
      if (!pad || !canvas || pad.isEmpty()) return;
      const svgPath = strokesToPath(pad.toData(), canvas.offsetWidth, canvas.offsetHeight);
      await save({
        endpoint: 'saveSignature',
        params: { role },
        body: { signerName: name.trim(), svgPath, signedAt: new Date().toISOString() },
        label: `${ROLE_LABELS[role]} signature`,
      });
    });

  const onRemove = () =>
    run(() => save({ endpoint: 'clearSignature', params: { role }, label: `Clear the ${ROLE_LABELS[role].toLowerCase()} signature` }));

  return (
    <div className={styles.pad}>
      <Text weight="semibold">{ROLE_LABELS[role]}</Text>
      {saved ? (
        <>
          <svg className={styles.preview} viewBox={`0 0 ${BOX.width} ${BOX.height}`} role="img" aria-label={`${ROLE_LABELS[role]} signature of ${saved.signerName}`}>
            <path d={saved.svgPath} fill="none" stroke={SIGNATURE_INK} strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" />
          </svg>
          <Text>
            {saved.signerName}, signed {formatDateTime(saved.signedAt, dateStyle)}
          </Text>
          {canSign && (
            <div className={card.actions}>
              <Button className={styles.action} disabled={isBusy} onClick={onRemove}>
                Remove signature
              </Button>
            </div>
          )}
        </>
      ) : canSign ? (
        <>
          <Field label="Name" required>
            <Input className={styles.name} value={name} maxLength={120} onChange={(_e, data) => setName(data.value)} />
          </Field>
          <canvas ref={canvasRef} className={styles.canvas} aria-label={`${ROLE_LABELS[role]} signs here with a finger`} />
          <Text size={200} className={styles.hint}>
            {ROLE_LABELS[role]}: sign on the line with a finger.
          </Text>
          <div className={card.actions}>
            <Button
              className={styles.action}
              disabled={isBusy}
              onClick={() => {
                padRef.current?.clear();
                setIsEmpty(true);
              }}
            >
              Clear
            </Button>
            <Button appearance="primary" className={styles.action} disabled={isBusy || isEmpty || name.trim() === ''} onClick={onSave}>
              Save signature
            </Button>
          </div>
        </>
      ) : (
        <Text>Not signed</Text>
      )}
      {error && <Text className={styles.error}>{error}</Text>}
    </div>
  );
}
