import { notFound } from "next/navigation";
import { AnalysesPanel } from "@/components/analyses/analyses-panel";
import { GroupDelayView } from "@/components/analyses/group-delay-view";
import { Panel, PanelHeader } from "@/components/ui/panel";
import { solveNetlist } from "@/solver";
import { SnapDemo } from "./snap-demo";

export const dynamic = "force-dynamic";

// A scratch page for looking at the analyses views with real solver output (development only).
// The hydrophone preamp example (solver/examples): noise, zeros and poles on one map.
const PREAMP = `Vh: vsource hyd gnd 1
Ch: capacitor hyd x 4.7n
Rb: resistor x gnd 1M
Rin: resistor x pos 10k
U1: opamp pos neg out gbw=10M pole2=40M en=4n in=0.5p fc=20
Rf: resistor out neg 100k
Rg: resistor neg gnd 1k
sweep 1Hz to 1MHz log 50 per decade
show gain = volts(out) / volts(hyd)
noise N = volts(out) input Vh
zeros volts(out)
poles
`;

const NETLIST = `title Bench sweep source, bridge oscillator study
let R = 10k
let C = 10n
Rs: resistor  out  mid  R   tol=1%
Cs: capacitor mid  pos  C   tol=5%
Rp: resistor  pos  gnd  R   tol=1%
Cp: capacitor pos  gnd  C   tol=5%
U1: opamp     pos  neg  out
Rf: resistor  neg  out  20.5k tol=1%
Rg: resistor  neg  gnd  10k   tol=1%
sweep 100Hz to 20kHz log 100 per decade
show  network = volts(pos) / volts(out)
loop  T cut out before Rs
measure f0     = zero-phase(T)
measure margin = mag(T) at f0
measure beta   = mag(network) at f0
check margin >= 1
check f0 between 1.5kHz and 1.7kHz
vary Rf over 19k, 20k, 21k, 22k
monte-carlo 200 seed=11
poles
sensitivity f0
`;

export default async function AnalysesScratchPage({
  searchParams,
}: {
  searchParams: Promise<{ job?: string; status?: string }>;
}) {
  if (process.env.NODE_ENV === "production") notFound();
  const { job, status } = await searchParams;
  const result = solveNetlist(NETLIST);
  const preamp = solveNetlist(PREAMP);
  return (
    <main className="mx-auto max-w-6xl space-y-6 px-4 py-8">
      {job ? (
        <Panel>
          <PanelHeader title="A queued run" description={`GET /api/runs/${job}/job, polled every second`} />
          <div className="p-5">
            <AnalysesPanel result={null} runId={job} status={status ?? "queued"} />
          </div>
        </Panel>
      ) : null}
      <Panel>
        <PanelHeader
          title="Analyses (development preview)"
          description="solveNetlist() of a bridge oscillator study"
        />
        <div className="p-5">
          {result.ok ? (
            <AnalysesPanel result={result} />
          ) : (
            <pre className="text-signal-fault text-sm">{JSON.stringify(result.errors, null, 2)}</pre>
          )}
        </div>
      </Panel>
      <Panel>
        <PanelHeader
          title="Noise, zeros and group delay"
          description="solveNetlist() of a hydrophone preamp"
        />
        <div className="space-y-6 p-5" data-testid="preamp-analyses">
          {preamp.ok ? (
            <>
              <AnalysesPanel result={preamp} />
              <GroupDelayView traces={preamp.traces} frequencies={preamp.frequencies} />
            </>
          ) : (
            <pre className="text-signal-fault text-sm">{JSON.stringify(preamp.errors, null, 2)}</pre>
          )}
        </div>
      </Panel>
      <Panel>
        <PanelHeader title="Standard parts helper" description="components/editor/snap-helper.tsx" />
        <div className="p-5">
          <SnapDemo />
        </div>
      </Panel>
    </main>
  );
}
