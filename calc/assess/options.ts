/**
 * The retrofit options `assess` compares, with stable codes (kebab-case; clients and stored results
 * refer to them).
 *
 * | code | what |
 * | --- | --- |
 * | keep | keep the motor as it is (the baseline) |
 * | rewind | rewind it when it fails (one more rewind penalty) |
 * | ie3, ie4, ie5 | a new motor of that class, same rated power; IE5 modelled as a line-operated motor at the IE5 level |
 * | bldc | a permanent-magnet (BLDC) motor with its drive, same speed and flow control as today |
 * | keep-vsd, rewind-vsd, ie3-vsd, ie4-vsd, ie5-vsd | the same with a variable-speed drive added that sets the flow (fans and pumps with throttle, damper, vanes or on/off only) |
 * | bldc-vsd | the BLDC whose drive also sets the flow (same condition) |
 */
export type OptionFamily = 'keep' | 'rewind' | 'ie3' | 'ie4' | 'ie5' | 'bldc';
export type OptionCode = OptionFamily | `${OptionFamily}-vsd`;

export interface OptionDefinition {
  code: OptionCode;
  family: OptionFamily;
  /** True when the option adds speed control of the flow. */
  speedControl: boolean;
  label: string;
}

const FAMILY_LABELS: Readonly<Record<OptionFamily, string>> = {
  keep: 'Keep as is',
  rewind: 'Rewind at failure',
  ie3: 'New IE3 motor',
  ie4: 'New IE4 motor',
  ie5: 'New IE5 motor',
  bldc: 'BLDC motor with drive',
};

export const OPTION_FAMILIES: readonly OptionFamily[] = ['keep', 'rewind', 'ie3', 'ie4', 'ie5', 'bldc'];

/** Every option, in the order results list them: the six families, then their speed-control variants. */
export const OPTIONS: readonly OptionDefinition[] = Object.freeze([
  ...OPTION_FAMILIES.map((family) => ({ code: family, family, speedControl: false, label: FAMILY_LABELS[family] })),
  ...OPTION_FAMILIES.map((family) => ({
    code: `${family}-vsd` as OptionCode,
    family,
    speedControl: true,
    label: family === 'bldc' ? 'BLDC motor with drive, + speed control' : `${FAMILY_LABELS[family]}, + speed control`,
  })),
]);

export const OPTION_CODES: readonly OptionCode[] = OPTIONS.map((option) => option.code);
