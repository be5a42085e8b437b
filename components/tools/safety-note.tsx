/** The plain cautions every sizing page carries. */
export function SafetyNote() {
  return (
    <aside aria-label="Safety" className="mt-8 rounded-lg border-l-4 border-caution-600 bg-caution-50 p-4 text-sm text-ink-800">
      <p className="font-semibold">▲ Fuel burns. Before anyone works on this system:</p>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        <li>Use lines, fittings and seals rated for the fuel — ethanol attacks some rubbers and metals.</li>
        <li>Pressure-test the system before the first start; work away from sparks, flames and hot parts.</li>
        <li>These figures are estimates: verify duty, lambda and fuel pressure on the dyno.</li>
        <li>Installation follows local codes and licensed practice.</li>
      </ul>
    </aside>
  );
}
