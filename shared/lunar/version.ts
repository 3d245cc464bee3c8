/**
 * Stored with every observation so later models can recompute. Bump the leading number whenever a change
 * moves any output beyond rounding; the rest names what the numbers rest on.
 */
export const LUNAR_MODEL_VERSION = 'shadowline-lunar/1; astronomy-engine 2.1.19; IAU WGCCRE 2009 lunar rotation; WMM2025'
