/**
 * betabound's environment switches (BETABOUND_HUGE_PAGES, BETABOUND_PREFAULT): auto, on or off, unset
 * meaning auto; a value it does not know is warned about once, in these words, and taken as auto.
 */

/** The values a switch takes. */
export const switchSettings = ["auto", "on", "off"] as const;
export type SwitchSetting = (typeof switchSettings)[number];

/** True when `value` is one of switchSettings. */
export function isSwitchSetting(value: string): value is SwitchSetting {
  return (switchSettings as readonly string[]).includes(value);
}

/** The switch `name` as `env` sets it (unset or unknown: auto), and the warning for a value it does not know. */
export function readSwitch(env: NodeJS.ProcessEnv, name: string): { setting: SwitchSetting; warning: string | null } {
  const value = env[name];
  if (value === undefined) return { setting: "auto", warning: null };
  if (isSwitchSetting(value)) return { setting: value, warning: null };
  return { setting: "auto", warning: `warning: ${name} is "${value}", not one of ${switchSettings.join(", ")}; using auto\n` };
}
