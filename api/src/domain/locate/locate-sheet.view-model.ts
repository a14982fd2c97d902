import { formatDate, spell } from '../format/date-time.js';
import { formatLength } from '../format/length.js';
import type { CautionText } from '../packet/packet-cautions.js';
import { locateCautions } from './locate-cautions.js';
import type { LocateViewResponse } from './locate-link.schema.js';

/** What the one-page locate sheet prints, every string already formatted (the template holds no logic). */
export interface LocateSheetViewModel {
  documentTitle: string;
  paper: { size: 'letter' | 'a4'; cssSize: string };
  siteLabel: string;
  addressLines: string[];
  installer: { companyName: string; phone: string | null; phoneHref: string | null; email: string | null; licences: string[] };
  homeownerNote: string | null;
  toleranceZone: string;
  /** The sheet's own words spelled for the company's locale (en-US "center", en-GB "centre"). */
  words: { center: string; color: string };
  runs: { label: string; cable: string; method: string; minDepth: string; maxDepth: string; isShallow: boolean; note: string }[];
  noRunsText: string | null;
  locateSteps: CautionText[];
  cautions: CautionText[];
  unitsNote: string;
  footer: string;
}

const METHOD_WORDS: Record<LocateViewResponse['runs'][number]['method'], string> = {
  direct_burial: 'direct burial',
  conduit: 'in conduit',
  under_hardscape_sleeve: 'sleeve under paving',
  indoor: 'indoors',
};

function day(iso: string): string {
  return iso.slice(0, 10);
}

/**
 * The locate sheet's view model from the locate view's own answer (the same data a digger sees on the
 * phone): shallow runs first, depths in the installer's units (fractions of an inch, or cm), the packet's
 * locate steps and safety cautions, the installer's name and phone.
 */
export function buildLocateSheetViewModel(view: LocateViewResponse, paper: 'letter' | 'a4'): LocateSheetViewModel {
  const { site, installer, units } = view;
  const depth = (m: number | null) => (m === null ? 'not recorded' : formatLength(m, units, 'short'));
  const ordered = [...view.runs.filter((r) => r.isShallow), ...view.runs.filter((r) => !r.isShallow)];
  return {
    documentTitle: `Locate sheet: ${site.label}`,
    paper: { size: paper, cssSize: paper === 'a4' ? 'A4' : 'Letter' },
    siteLabel: site.label,
    addressLines: [site.addressLine1, site.addressLine2, [site.postalCode, site.city, site.region].filter(Boolean).join(' ')].filter((l): l is string => Boolean(l)),
    installer: {
      companyName: installer.companyName,
      phone: installer.phone,
      phoneHref: installer.phone ? `tel:${installer.phone.replace(/[^+\d]/g, '')}` : null,
      email: installer.email,
      licences: installer.licenceNumbers,
    },
    homeownerNote: view.link.note,
    // As the packet and the cautions below write it (18 in, or 0.5 m).
    toleranceZone: locateCautions(units).toleranceZone,
    words: { center: spell('center', view.locale), color: spell('color', view.locale) },
    runs: ordered.map((r) => ({
      label: r.label,
      cable: `${r.cable} ${r.gauge}${r.method === 'direct_burial' ? '' : `, ${METHOD_WORDS[r.method]}`}`.trim(),
      method: METHOD_WORDS[r.method],
      minDepth: depth(r.minDepthM),
      maxDepth: depth(r.maxDepthM),
      isShallow: r.isShallow,
      note: [
        r.isShallow ? `SHALLOWER than the depth rule${r.minCoverM !== null ? ` (${formatLength(r.minCoverM, units, 'short')})` : ''}: hand-dig` : '',
        r.isAbandoned ? (r.abandonedOn ? `abandoned since ${formatDate(r.abandonedOn)}` : 'abandoned') : r.isSpare ? 'spare' : '',
        // Provenance (issue 21): when it went in and by which job, so later cable reads apart from older.
        r.installedOn ? `installed ${formatDate(r.installedOn)}${r.installedByJobTitle ? ` by “${r.installedByJobTitle}”` : ''}` : '',
      ]
        .filter(Boolean)
        .join('; '),
    })),
    noRunsText: view.runs.length === 0 ? 'No runs have been recorded at this site.' : null,
    locateSteps: view.locateSteps,
    cautions: view.cautions,
    unitsNote: units === 'metric' ? 'Lengths in metres, depths in centimetres.' : 'Lengths in feet and inches, depths in inches.',
    footer: `Printed from the locate link on ${day(view.generatedAt)}; the link works until ${day(view.link.expiresAt)}. Positions and depths are as recorded at installation: verify by hand-digging. This sheet is not a code inspection or approval; follow local codes and the authority having jurisdiction.`,
  };
}
