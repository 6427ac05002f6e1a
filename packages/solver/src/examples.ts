/**
 * The first example of the language reference (LANGUAGE.md, and the design's
 * cell-language.md): a unity-gain second-order low-pass, Butterworth, designed for
 * fc = 1 kHz. The landing page draws it; the tests of every package start from it.
 */
export const FIRST_EXAMPLE = `# 2nd-order unity-gain low-pass, Butterworth, fc = 1 kHz
let R  = 10k
let Cb = 11.25n
let Ca = 2*Cb

drive in                             # 1 V AC between node in and gnd
R1 [in a]       R      ±1%
R2 [a b]        R      ±1%
C1 [a out]      Ca     ±5%
C2 [b gnd]      Cb     ±5%  esr 20m
U1 [b out out]  opamp  gain 100dB  gbw 1M

show out                             # H = V(out) / drive
sweep 10 .. 100k, 100/decade
require out gain >= -0.3 dB over 10 .. 500
require out corner = 1k ± 2%
require out gain <= -38 dB over 10k ..`;
