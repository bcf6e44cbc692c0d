import { Notice } from '@/components/ui/notice';

/** The usual cautions for the work a claim involves; local codes and licensed practice come first. */
export function SafetyNotes({ category }: { category: string }) {
  if (category === 'battery') {
    return (
      <Notice tone="warning" title="Lithium battery: handle a suspect pack with care">
        <ul className="list-disc space-y-1 pl-5">
          <li>A damaged or defective battery can overheat or catch fire. Take it off the bike, isolate it and store it away from anything that burns, ideally in a fire-resistant container.</li>
          <li>Do not charge, open or ship a swollen, hot, smelling or dropped pack. It may only travel under the dangerous-goods rules for damaged batteries (ground only, special packaging).</li>
          <li>Follow your carrier’s rules, local regulations and your trained staff; this list does not replace them.</li>
        </ul>
      </Notice>
    );
  }
  if (['drive_unit', 'controller', 'display', 'charger'].includes(category)) {
    return (
      <Notice tone="warning" title="Electrical work and dyno runs">
        <ul className="list-disc space-y-1 pl-5">
          <li>Disconnect the battery before opening a motor, controller or wiring.</li>
          <li>On the dyno: secure the bike, keep hands and clothing clear of the roller and wheel, wear eye protection and keep the area behind the bike clear.</li>
          <li>Local codes and the maker’s service instructions come first.</li>
        </ul>
      </Notice>
    );
  }
  return null;
}
