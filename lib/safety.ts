/** The cautions printed on every sizing page and spec sheet. */
export const SAFETY_TITLE = "Fuel burns. Before anyone works on this system:";
export const SAFETY_POINTS = [
  "Use lines, fittings and seals rated for the fuel — ethanol attacks some rubbers and metals.",
  "Pressure-test the system before the first start; work away from sparks, flames and hot parts.",
  "These figures are estimates: verify duty, lambda and fuel pressure on the dyno.",
  "Installation follows local codes and licensed practice.",
] as const;
