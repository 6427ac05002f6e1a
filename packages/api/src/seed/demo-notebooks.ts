/**
 * The demo notebooks: the work of a fictional small instruments company (the people of
 * demo-users.ts). Every circuit cell is written in Rolloff's own cell language, in today's
 * forms (reference designators with each part's role in a comment), and compiles without
 * errors; a few requirements fail on purpose in early revisions, as they did while the team
 * iterated. The products are named by what they are, not by model codes that could be taken
 * for someone's real product. All part values and figures are invented for the demo.
 */
import type { MemberRole } from '../db/entities/notebook-member.js';

/** Circuit-cell texts, by name. */
export const demoCircuits = {
  antiAliasFirstTry: `# First try: one unity-gain Sallen-Key stage, Butterworth, corner 4 kHz
let R  = 10k
let w  = 2*pi*4k
let Q  = 0.7071

drive in                              # sensor amplifier output, 1 V
R1 [in a]      R      ±1%
R2 [a b]       R      ±1%
C1 [a out]     (2*Q/(w*R))   ±5%
C2 [b gnd]     (1/(2*Q*w*R)) ±5%
U1 [b out out] opamp gain 100dB gbw 10M

show out
sweep 10 .. 100k, 100/decade
require out gain >= -0.5 dB over 10 .. 2k
require out corner = 4k ± 5%
require out gain <= -40 dB over 14k ..
`,
  antiAliasFourthOrderDraft: `# Fourth-order Butterworth, corner 4 kHz: two unity-gain Sallen-Key stages
# (Q = 0.541 and 1.307), then the RC at the converter pin that soaks up its sampling kicks.
let R  = 10k
let w  = 2*pi*4k
let Q1 = 0.5412
let Q2 = 1.3066

drive in
R1 [in a1]       R                ±1%
R2 [a1 b1]       R                ±1%
C1 [a1 o1]       (2*Q1/(w*R))     ±5%
C2 [b1 gnd]      (1/(2*Q1*w*R))   ±5%
U1 [b1 o1 o1]    opamp gain 100dB gbw 10M

R3 [o1 a2]       R                ±1%
R4 [a2 b2]       R                ±1%
C3 [a2 o2]       (2*Q2/(w*R))     ±5%
C4 [b2 gnd]      (1/(2*Q2*w*R))   ±5%
U2 [b2 o2 o2]    opamp gain 100dB gbw 10M

R5 [o2 adc]      100              ±1%
C5 [adc gnd]     2n2              ±10%  esr 10m

show "converter pin" adc
sweep 10 .. 100k, 100/decade
require "converter pin" gain >= -0.5 dB over 10 .. 2k
require "converter pin" corner = 4k ± 5%
require "converter pin" gain <= -40 dB over 14k ..
`,
  antiAliasFourthOrder: `# Fourth-order Butterworth, corner 4 kHz: two unity-gain Sallen-Key stages
# (Q = 0.541 and 1.307), then the RC at the converter pin that soaks up its sampling kicks.
let R  = 10k
let w  = 2*pi*4k
let Q1 = 0.5412
let Q2 = 1.3066

drive in
R1 [in a1]       R                ±1%
R2 [a1 b1]       R                ±1%
C1 [a1 o1]       (2*Q1/(w*R))     ±5%
C2 [b1 gnd]      (1/(2*Q1*w*R))   ±5%
U1 [b1 o1 o1]    opamp gain 100dB gbw 10M

R3 [o1 a2]       R                ±1%
R4 [a2 b2]       R                ±1%
C3 [a2 o2]       (2*Q2/(w*R))     ±5%
C4 [b2 gnd]      (1/(2*Q2*w*R))   ±5%
U2 [b2 o2 o2]    opamp gain 100dB gbw 10M

R5 [o2 adc]      100              ±1%
C5 [adc gnd]     2n2              ±10%  esr 10m

show "converter pin" adc
sweep 10 .. 100k, 100/decade
require "converter pin" gain >= -0.5 dB over 10 .. 2k
require "converter pin" corner = 4k ± 5%
require "converter pin" gain <= -40 dB over 14k ..
require "converter pin" peak <= 0.2 dB
`,
  antiAliasSnapped: `# The same filter with the capacitors snapped to E24 and the resistors to E96
drive in
R1 [in a1]       10k    ±1%
R2 [a1 b1]       10k    ±1%
C1 [a1 o1]       4n3    ±5%
C2 [b1 gnd]      3n6    ±5%
U1 [b1 o1 o1]    opamp gain 100dB gbw 10M

R3 [o1 a2]       10k    ±1%
R4 [a2 b2]       10k    ±1%
C3 [a2 o2]       10n    ±5%
C4 [b2 gnd]      1n5    ±5%
U2 [b2 o2 o2]    opamp gain 100dB gbw 10M

R5 [o2 adc]      100    ±1%
C5 [adc gnd]     2n2    ±10%

show adc
sweep 10 .. 100k
require adc gain >= -0.5 dB over 10 .. 2k
require adc gain <= -40 dB over 14k ..
spread 200 draws seed 7               # the parts within their tolerances, for the review's question
`,
  antiAliasMultipleFeedback: `# Fourth-order Butterworth again, as two multiple-feedback stages: fewer parts see the
# op-amp's output impedance at high frequency. Each stage inverts; two make it upright.
let R  = 10k
let w  = 2*pi*4k
let k1 = (3*0.5412)^2                 # C1/C2 for Q = 0.541 with equal resistors
let k2 = (3*1.3066)^2                 # and for Q = 1.307

drive in
R1 [in a1]      R   ±1%
R2 [a1 o1]      R   ±1%
R3 [a1 b1]      R   ±1%
C1 [a1 gnd]     (sqrt(k1)/(w*R))      ±5%
C2 [b1 o1]      (1/(sqrt(k1)*w*R))    ±5%
U1 [gnd b1 o1]  opamp gain 100dB gbw 10M

R4 [o1 a2]      R   ±1%
R5 [a2 o2]      R   ±1%
R6 [a2 b2]      R   ±1%
C3 [a2 gnd]     (sqrt(k2)/(w*R))      ±5%
C4 [b2 o2]      (1/(sqrt(k2)*w*R))    ±5%
U2 [gnd b2 o2]  opamp gain 100dB gbw 10M

R7 [o2 adc]     100  ±1%
C5 [adc gnd]    2n2  ±10%

show "converter pin" adc
sweep 10 .. 100k
require "converter pin" gain >= -0.5 dB over 10 .. 2k
require "converter pin" corner = 4k ± 5%
require "converter pin" gain <= -40 dB over 14k ..
`,
  trebleLift: `# Treble lift: a shelving network, then a non-inverting stage that makes up its loss
let Rs = 10k
let Rg = 2k2

drive in                              # preamp output, 1 V
R5 [in src]    100    noise off       # the preamp's output resistance: its noise is the preamp's
R1 [src sh]    Rs     ±1%
C1 [src sh]    4n7    ±5%             # bypasses R1 above a few kHz
R2 [sh gnd]    Rg     ±1%
U1 [sh fb out] opamp gain 100dB gbw 3M vnoise 8n inoise 1p
R3 [out fb]    45k3   ±1%             # make-up gain: 1 + R3/R4
R4 [fb gnd]    10k    ±1%

show out
sweep 20 .. 20k
require out gain = 0 dB ± 0.5 dB at 100
require out gain >= 10 dB at 20k
`,
  bassAndTrebleLift: `# Bass lift and treble lift in one network, flat through the midrange
drive in
# treble section: the shelving network and make-up stage of the cell above
R1 [in sh]     10k    ±1%
C1 [in sh]     4n7    ±5%
R2 [sh gnd]    2k2    ±1%
U1 [sh fb1 t]  opamp gain 100dB gbw 3M
R3 [t fb1]     45k3   ±1%
R4 [fb1 gnd]   10k    ±1%
# bass section: the shunt arm stops cutting below its corner
R5 [t b]       10k    ±1%
R6 [b m]       2k2    ±1%
C2 [m gnd]     1u     ±10%
U2 [b fb2 out] opamp gain 100dB gbw 3M
R7 [out fb2]   45k3   ±1%
R8 [fb2 gnd]   10k    ±1%

show out
sweep 20 .. 20k
require out gain >= 6 dB at 20
require out gain >= 6 dB at 20k
require out gain = 0 dB ± 1.5 dB at 1k
`,
  railFirstLayout: `# Analog 3.3 V rail at the converter's supply pin: regulator, ferrite bead, three capacitors
L1 [reg r]    400n                    # regulator output, inductive above its loop bandwidth
R1 [r gnd]    15m                     # regulator output resistance
L2 [reg pin]  1u    dcr 60m           # ferrite bead: inductive below its loss peak…
R2 [reg pin]  120                     # …and resistive above it
C1 [pin gnd]  10u   esr 25m esl 1n2   # bulk
C2 [pin gnd]  1u    esr 10m esl 600p
C3 [pin gnd]  100n  esr 15m esl 400p

show impedance pin
sweep 1k .. 200M, 50/decade
require impedance pin magnitude <= 1 ohm over 10k .. 50M
`,
  railDamped: `# Same rail with a damping arm: 1.5 Ω in series with 47 µF across the pin
L1 [reg r]    400n                    # regulator output
R1 [r gnd]    15m
L2 [reg pin]  1u    dcr 60m           # ferrite bead
R2 [reg pin]  120
C1 [pin gnd]  10u   esr 25m esl 1n2
C2 [pin gnd]  1u    esr 10m esl 600p
C3 [pin gnd]  100n  esr 15m esl 400p
R3 [pin d]    1R5                     # damping arm: 1.5 Ω…
C4 [d gnd]    47u   esr 30m           # …in series with an electrolytic

show impedance pin
sweep 1k .. 200M, 50/decade
require impedance pin magnitude <= 1 ohm over 10k .. 50M
`,
  loopFirstCompensation: `# Loop gain of the 3.3 V regulator, opened at the top of the feedback divider.
# The drive stands in for the output there; T = V(out) / V(inj) around the loop.
let gfs = 2                           # pass device transconductance, A/V at 1 A load

drive inj
R1  [inj fb]   100k   ±1%             # divider top: 3.3 V → 1.24 V reference
R2  [fb gnd]   60k4   ±1%             # divider bottom
U1  [gnd fb e] opamp gain 80dB gbw 1M # error amplifier, reference is AC ground
R3  [fb z]     10k                    # type II compensation: the zero…
C1  [z e]      10n
C2  [fb e]     100p                   # …and the pole above it
A1  [out gnd gnd e] gm gfs            # pass device: gate down, current up
C3  [out gnd]  10u    esr 20m         # output capacitor
R4  [out gnd]  3R3                    # 1 A load

show loop out / inj
sweep 10 .. 10M
require loop phase-margin >= 45 deg
require loop crossover >= 20k
`,
  loopTypeII: `# Loop gain of the 3.3 V regulator, opened at the top of the feedback divider.
# The drive stands in for the output there; T = V(out) / V(inj) around the loop.
let gfs = 2                           # pass device transconductance, A/V at 1 A load

drive inj
R1  [inj fb]   100k   ±1%             # divider top: 3.3 V → 1.24 V reference
R2  [fb gnd]   60k4   ±1%             # divider bottom
U1  [gnd fb e] opamp gain 80dB gbw 1M # error amplifier, reference is AC ground
R3  [fb z]     91k                    # type II compensation: the zero…
C1  [z e]      1n
C2  [fb e]     10p                    # …and the pole above it
A1  [out gnd gnd e] gm gfs            # pass device: gate down, current up
C3  [out gnd]  10u    esr 20m         # output capacitor
R4  [out gnd]  3R3                    # 1 A load

show loop out / inj
sweep 10 .. 10M
require loop phase-margin >= 45 deg
require loop crossover >= 20k
`,
  loopSlowAmplifier: `# Loop gain of the 3.3 V regulator, opened at the top of the feedback divider.
# The drive stands in for the output there; T = V(out) / V(inj) around the loop.
let gfs = 2                           # pass device transconductance, A/V at 1 A load

drive inj
R1  [inj fb]   100k   ±1%             # divider top: 3.3 V → 1.24 V reference
R2  [fb gnd]   60k4   ±1%             # divider bottom
U1  [gnd fb e] opamp gain 80dB gbw 200k # error amplifier, reference is AC ground
R3  [fb z]     91k                    # type II compensation: the zero…
C1  [z e]      1n
C2  [fb e]     10p                    # …and the pole above it
A1  [out gnd gnd e] gm gfs            # pass device: gate down, current up
C3  [out gnd]  10u    esr 20m         # output capacitor
R4  [out gnd]  3R3                    # 1 A load

show loop out / inj
sweep 10 .. 10M
require loop phase-margin >= 45 deg
require loop crossover >= 20k
`,
} as const;

export interface DemoCell {
  kind: 'circuit' | 'note';
  text: string;
  /** Later saves of this cell, in order, each by a login (a new revision each). */
  edits?: { by: string; text: string }[];
}

/** A pin on a circuit cell's plot (by the cell's position), with the replies in its thread. */
export interface DemoPin {
  by: string;
  cell: number;
  trace: string;
  frequency: number;
  text: string;
  replies: { by: string; text: string }[];
}

/** A review round on the notebook's latest version: who asks whom, the pins, then the decisions. */
export interface DemoReview {
  by: string;
  reviewers: string[];
  message: string;
  pins: DemoPin[];
  decisions: { by: string; state: 'needs_changes' | 'signed_off'; summary: string }[];
}

export interface DemoNotebook {
  key: string;
  title: string;
  /** Plain text shown under the title. */
  description: string;
  owner: string;
  members: [string, MemberRole][];
  visibility: 'private' | 'link';
  cells: DemoCell[];
  /** Versions made after the edits, by the given login. */
  versions: { by: string; label: string }[];
  /** A review in progress, so a newcomer sees what one looks like. */
  review?: DemoReview;
  /** How long ago the work happened, so the list and histories read like a real week. */
  daysAgo: number;
}

export const demoNotebooks: DemoNotebook[] = [
  {
    key: 'anti-alias',
    title: 'Anti-alias filter for the vibration-sensor converter',
    description: "Filter between the vibration sensor's charge amplifier and the converter: flat to 2 kHz, at least 40 dB down from 14 kHz at 16 kS/s.",
    owner: 'ines.carvalho',
    members: [
      ['tobias.okafor', 'editor'],
      ['kenji.arai', 'reviewer'],
      ['priya.venkat', 'viewer'],
    ],
    visibility: 'private',
    daysAgo: 6,
    cells: [
      {
        kind: 'note',
        text: `# Anti-alias filter, vibration sensor

The charge amplifier hands us 0.5 Hz – 2 kHz. The converter samples at **16 kS/s**, so
anything from 14 kHz up folds back into the band we measure.

Requirements for the filter between the amplifier and the converter pin:

- flat within 0.5 dB up to 2 kHz
- at least 40 dB down from 14 kHz
- no peaking (the gain is calibrated at 160 Hz)
`,
      },
      { kind: 'circuit', text: demoCircuits.antiAliasFirstTry },
      {
        kind: 'note',
        text: `One second-order stage gives only about 22 dB at 14 kHz. Moving the corner down would
eat into the flat band, so the next cell goes to fourth order with the same 4 kHz corner.`,
      },
      {
        kind: 'circuit',
        text: demoCircuits.antiAliasFourthOrderDraft,
        edits: [{ by: 'ines.carvalho', text: demoCircuits.antiAliasFourthOrder }],
      },
      { kind: 'circuit', text: demoCircuits.antiAliasSnapped },
      {
        kind: 'note',
        text: `Snapping to standard values moves the corner up by under 2 %; the attenuation at 14 kHz
stays near 43 dB. Tobias will measure the first boards on the bench next week.`,
      },
    ],
    versions: [{ by: 'ines.carvalho', label: 'Design review 1' }],
    review: {
      by: 'ines.carvalho',
      reviewers: ['kenji.arai'],
      message:
        'The fourth-order filter (Circuit 4) and its snapped values (Circuit 5). Mostly the stopband at 14 kHz, please: that is where we have the least room.',
      pins: [
        {
          by: 'kenji.arai',
          cell: 3,
          trace: 'converter pin',
          frequency: 14_000,
          text: 'About 43 dB down here with every part at its nominal value. How much of the 3 dB of room is left with 5 % capacitors?',
          replies: [
            {
              by: 'ines.carvalho',
              text: 'Fair question. Circuit 5 now carries a spread over the tolerances; I will post the worst draw next to the bench figures.',
            },
          ],
        },
        {
          by: 'kenji.arai',
          cell: 4,
          trace: 'adc',
          frequency: 2_000,
          text: 'Flat to 2 kHz after snapping: fine by me.',
          replies: [],
        },
      ],
      decisions: [
        {
          by: 'kenji.arai',
          state: 'needs_changes',
          summary: 'Show the attenuation at 14 kHz across the tolerances before we order boards. The rest reads well.',
        },
      ],
    },
  },
  {
    key: 'tone',
    title: 'Tone network for the bench audio amplifier',
    description: "Gentle bass and treble lift for the bench amplifier's listening tests; the midrange stays flat.",
    owner: 'tobias.okafor',
    members: [
      ['mara.lindqvist', 'editor'],
      ['priya.venkat', 'reviewer'],
      ['ines.carvalho', 'viewer'],
    ],
    visibility: 'link',
    daysAgo: 4,
    cells: [
      {
        kind: 'note',
        text: `# Tone network, bench audio amplifier

Customers asked for a gentle lift at both ends of the audio band for listening tests,
flat through the midrange. Two shelving sections, each followed by a stage that makes up
its loss. Shared by link with the whole team for the listening test.
`,
      },
      { kind: 'circuit', text: demoCircuits.trebleLift },
      { kind: 'circuit', text: demoCircuits.bassAndTrebleLift },
    ],
    versions: [{ by: 'tobias.okafor', label: 'Listening test build' }],
  },
  {
    key: 'decoupling',
    title: 'Decoupling network for the mixed-signal board',
    description: 'Analog rail of the mixed-signal board: below 1 Ω at the converter supply pin from 10 kHz to 50 MHz.',
    owner: 'kenji.arai',
    members: [
      ['priya.venkat', 'editor'],
      ['ines.carvalho', 'reviewer'],
      ['tobias.okafor', 'viewer'],
    ],
    visibility: 'private',
    daysAgo: 3,
    cells: [
      {
        kind: 'note',
        text: `# Analog rail of the mixed-signal board

Target: below 1 Ω at the converter's supply pin from 10 kHz to 50 MHz. The first layout
puts the regulator, a ferrite bead and three capacitors on the rail; see the revisions of
the next cell for the anti-resonance we found and the damping arm that tames it.
`,
      },
      {
        kind: 'circuit',
        text: demoCircuits.railFirstLayout,
        edits: [{ by: 'priya.venkat', text: demoCircuits.railDamped }],
      },
      {
        kind: 'note',
        text: `With 1.5 Ω and 47 µF across the pin the peak near 40 kHz drops from about 1.3 Ω to
0.7 Ω. The damping capacitor can be an inexpensive electrolytic: its ESR only helps.`,
      },
    ],
    versions: [{ by: 'kenji.arai', label: 'Layout rev B' }],
  },
  {
    key: 'regulator',
    title: 'Compensation of the 3.3 V regulator loop',
    description: 'Crossover above 20 kHz with at least 45° of phase margin at full load.',
    owner: 'priya.venkat',
    members: [
      ['kenji.arai', 'editor'],
      ['mara.lindqvist', 'reviewer'],
      ['tobias.okafor', 'viewer'],
    ],
    visibility: 'private',
    daysAgo: 1,
    cells: [
      {
        kind: 'note',
        text: `# 3.3 V regulator loop

Goals: crossover above 20 kHz so the rail recovers quickly from load steps, and at least
45° of phase margin at full load. The loop is opened at the top of the feedback divider.
`,
      },
      {
        kind: 'circuit',
        text: demoCircuits.loopFirstCompensation,
        edits: [{ by: 'priya.venkat', text: demoCircuits.loopTypeII }],
      },
      {
        kind: 'note',
        text: `The first compensation crossed over at only 1.3 kHz. With 91 kΩ and 1 nF the loop crosses
at about 27 kHz with over 80° of margin. Next cell: the same loop with the slower error
amplifier we may have to second-source.`,
      },
      { kind: 'circuit', text: demoCircuits.loopSlowAmplifier },
    ],
    versions: [{ by: 'priya.venkat', label: 'Before the bench check' }],
  },
];

/** The fork: Kenji tries multiple-feedback stages from the reviewed version of the anti-alias filter. */
export const demoFork = {
  from: 'anti-alias',
  version: 1,
  by: 'kenji.arai',
  title: 'Anti-alias filter, multiple-feedback try',
  /** The forked cell (by position) that Kenji rewrites, and with what. */
  edit: { position: 3, text: demoCircuits.antiAliasMultipleFeedback },
  members: [['ines.carvalho', 'reviewer']] as [string, MemberRole][],
  daysAgo: 2,
};
