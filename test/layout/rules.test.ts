import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { DEFAULT_RULES, RULE_SPECS, parseRuleValue, ruleSpecByKey, rulesTableMarkdown } from '../../src/layout/rules.js';
import { readmeWithRulesTable } from '../tools/write-generated.js';

describe('shared/rules.json', () => {
  it('has one entry per Rules field, with unique keys, a doc sentence and a source', () => {
    const fields = RULE_SPECS.map((s) => s.field).sort();
    expect(fields).toEqual(Object.keys({ ...DEFAULT_RULES, fluxBandwidthGHz: 0 }).sort());
    expect(new Set(RULE_SPECS.map((s) => s.key)).size).toBe(RULE_SPECS.length);
    for (const s of RULE_SPECS) {
      expect(s.doc).toMatch(/\.$/);
      expect(s.source.length).toBeGreaterThan(0);
      expect(s.field.startsWith(s.key)).toBe(true); // layout key = field without its unit suffix
    }
  });

  it('defaults in internal units (GHz, ns): the values the foundation issue fixes', () => {
    expect(DEFAULT_RULES).toEqual({
      zzLimitGHz: 2e-4, // 200 kHz
      detuning0101GHz: 0.05,
      detuning0112GHz: 0.03,
      detuningNext0101GHz: 0.03,
      tlsClearanceGHz: 0.005,
      readoutDetuningGHz: 0.3,
      spectatorAdmixture: 0.02,
      sweptTransferLimit: 1e-3,
      maxGateNs: 100,
      sampleRateGHz: 2.4,
      resistanceSpread: 0.02,
      marginFlagSpreads: 3,
      spectatorRangeMarginSpreads: 0,
      fluxBandwidthGHz: 1,
      maxFluxExcursion: 0.45,
      gateErrorLimit: 0.01,
      spectatorLeakageLimit: 1e-3,
      idleErrorLimit: 0.02,
      cycleOverheadNs: 600,
      noiseAveragingTimeNs: 1e9,
      qubitTemperatureK: 0.05,
    });
    expect(Object.isFrozen(DEFAULT_RULES)).toBe(true);
  });

  it('a temperature rule reads units of temperature (qubitTemperature: 50 mK is 0.05 K)', () => {
    expect(parseRuleValue(ruleSpecByKey('qubitTemperature')!, '20 mK')).toEqual({ ok: true, value: 0.02 });
    expect(parseRuleValue(ruleSpecByKey('qubitTemperature')!, '20 MHz')).toMatchObject({ ok: false });
  });

  it('parseRuleValue checks kind and range', () => {
    const spec = (k: string) => ruleSpecByKey(k)!;
    expect(parseRuleValue(spec('zzLimit'), '150 kHz')).toEqual({ ok: true, value: 1.5e-4 });
    expect(parseRuleValue(spec('detuning0101'), '0 MHz')).toEqual({ ok: true, value: 0, warning: '0 MHz is unusual for detuning0101 (usually 5 MHz to 500 MHz)' });
    expect(parseRuleValue(spec('zzLimit'), '0 kHz')).toEqual({ ok: false, message: 'expected a frequency greater than 0, found 0 kHz' });
    expect(parseRuleValue(spec('detuning0101'), '-1 MHz')).toEqual({ ok: false, message: 'expected a frequency of at least 0, found -1 MHz' });
    expect(parseRuleValue(spec('fluxBandwidth'), null)).toEqual({ ok: true, value: undefined });
    expect(parseRuleValue(spec('maxGate'), null)).toEqual({ ok: false, message: 'expected a time, found an empty value (only optional rules may be null)' });
    expect(parseRuleValue(spec('resistanceSpread'), Number.NaN)).toEqual({ ok: false, message: 'expected a number, found NaN' });
    expect(parseRuleValue(spec('marginFlagSpreads'), '3')).toEqual({ ok: false, message: 'expected a number, found the text "3"' });
  });

  it('parseRuleValue refuses values outside the hard range of rules.json and warns outside the usual one', () => {
    const spec = (k: string) => ruleSpecByKey(k)!;
    expect(parseRuleValue(spec('sampleRate'), '1 PHz')).toEqual({ ok: false, message: 'expected sampleRate from 100 MHz to 100 GHz, found 1 PHz (outside what the model can answer; see README "Guarantees and limits")' });
    expect(parseRuleValue(spec('maxGate'), '1 s')).toMatchObject({ ok: false });
    expect(parseRuleValue(spec('maxGate'), '2 us')).toEqual({ ok: true, value: 2000, warning: '2 us is unusual for maxGate (usually 20 ns to 500 ns)' });
    expect(parseRuleValue(spec('sweptTransferLimit'), 0.2)).toEqual({ ok: true, value: 0.2, warning: '0.2 is unusual for sweptTransferLimit (usually 0.000001 to 0.05)' });
  });

  it('every default of rules.json lies inside its usual range', () => {
    for (const s of RULE_SPECS) {
      const r = parseRuleValue(s, s.default);
      expect(r, s.key).toMatchObject({ ok: true });
      expect((r as { warning?: string }).warning, s.key).toBeUndefined();
      expect(s.plausible, s.key).toBeDefined();
    }
  });

  it("the README's rules table is the one generated from rules.json (run npm run generated after a change)", () => {
    const readme = readFileSync('README.md', 'utf8');
    expect(readme).toContain(rulesTableMarkdown());
    expect(readmeWithRulesTable(readme)).toBe(readme);
    for (const s of RULE_SPECS) expect(readme).toContain(`| \`${s.key}\` |`);
  });
});
