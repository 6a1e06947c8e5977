import { fixed, percent } from "@/lib/plate-check/format";
import type { TryMeasures } from "@/lib/plate-check/schemas";

/** The numbers beside a tried render: how much marker is left, what happened to the grain, what else moved. */
export function TryMeasuresTable({ measures: m }: { measures: TryMeasures }) {
  const ch = m.targetChannel.toUpperCase();
  const left = m.markerContrast && m.markerContrast.before > 0 ? m.markerContrast.after / m.markerContrast.before : null;
  return (
    <table className="w-full text-left text-xs">
      <caption className="sr-only">Measured on the {m.proxyWidth}-pixel proxy</caption>
      <tbody className="[&_td]:py-0.5 [&_th]:py-0.5 [&_th]:pr-2 [&_th]:font-normal [&_th]:text-muted">
        <tr>
          <th scope="row">Marker contrast in {ch}</th>
          <td className="font-mono">
            {m.markerContrast ? `${fixed(m.markerContrast.before, 4)} → ${fixed(m.markerContrast.after, 4)}${left !== null ? ` (${percent(left, 0)} left)` : ""}` : "no markers to measure"}
          </td>
        </tr>
        <tr>
          <th scope="row">Noise gain in {ch}</th>
          <td className="font-mono">
            {m.noiseGain === null ? "—" : `${fixed(m.noiseGain, 2)}×`}
            {m.matrixGain !== null ? ` (matrix row ‖r‖ ${fixed(m.matrixGain, 2)})` : ""}
          </td>
        </tr>
        <tr>
          <th scope="row">Changed outside the marker matte</th>
          <td className="font-mono">{percent(m.changedOutsideMatte, 2)} of pixels</td>
        </tr>
        <tr>
          <th scope="row">Solver residual per shade</th>
          <td className="font-mono">{m.residualPerShade.length ? m.residualPerShade.map((r, i) => `${i + 1}: ${fixed(Math.abs(r), 5)}`).join(" · ") : "no matrix solved"}</td>
        </tr>
        <tr>
          <th scope="row">Proxy render</th>
          <td className="font-mono">{m.proxyWidth} px wide, {m.renderMs} ms</td>
        </tr>
      </tbody>
    </table>
  );
}
