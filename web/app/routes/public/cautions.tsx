// /cautions: where trial work can hurt someone, and what to do about it.
import type { ReactNode } from 'react';
import { PageHeader } from '../../../components/ui/page-header';

interface Caution {
  id: string;
  title: string;
  lead: string;
  points: ReactNode[];
}

const CAUTIONS: Caution[] = [
  {
    id: 'treated-seed',
    title: 'Treated seed',
    lead: 'Seed coated with fungicide or insecticide is usually dyed pink, red, blue or green. It is a pesticide product, not food.',
    points: [
      'Read the seed tag or bag label before you open the bag, and do what it says about protective gear, storage and disposal.',
      'Wear chemical-resistant gloves with no fabric lining when you weigh, bag or pour treated seed. Wash your hands before you eat, drink or smoke.',
      'Never feed treated seed, or grain mixed with it, to people or livestock. Leftover seed does not go in the feed bin or to the elevator.',
      'Keep bags and strip envelopes out of reach of children and pets, and label every envelope.',
      'Pick up spills straight away and cover seed left on the soil surface at strip ends, where birds and animals will find it.',
    ],
  },
  {
    id: 'machines',
    title: 'Rotary tillers and walk-behind seeders',
    lead: 'Small machines still have spinning tines, chains and hot engines, and strip work puts you close to them for hours.',
    points: [
      'Walk each strip before you start and clear stones, wire and sticks that tines can throw or catch.',
      'Keep other people, children and pets well away while the machine runs.',
      'Keep every guard and shield in place. Read the operator’s manual and know how to stop the engine and the tines before you start.',
      'Refuel only with the engine off and cooled down.',
      'Shut the engine off and wait for every part to stop before you clear a clog, adjust the seeder or change a seed plate. Pull the spark plug wire for longer jobs.',
      'Wear sturdy closed boots and long trousers; keep loose sleeves and cords away from moving parts.',
    ],
  },
  {
    id: 'grain-dust',
    title: 'Grain dust when threshing and cleaning',
    lead: 'Threshing sheaves and cleaning or sieving grain raise fine dust that carries chaff, mould spores and soil.',
    points: [
      'Work outdoors or where air moves freely, and stand upwind where you can.',
      'Wear a NIOSH-approved particulate respirator (N95 or better) that fits your face. A cloth or unrated dust mask does not protect your lungs.',
      'Wear eye protection, and shake out clothes away from the house.',
    ],
  },
  {
    id: 'hearing',
    title: 'Hearing',
    lead: 'Tillers, plot threshers, seed cleaners and blowers often run above 85 dB, the level at which hearing damage builds up over time.',
    points: [
      'If you must shout to be heard by someone an arm’s length away, it is loud enough to need protection.',
      'Wear earplugs or earmuffs whenever a machine is running, and give helpers a pair too.',
    ],
  },
  {
    id: 'local-advice',
    title: 'Local advice comes first',
    lead: 'Rates in a trial are treatments to compare, not recommendations.',
    points: [
      'Planting dates, seeding rates and fertility follow your local extension service’s advice, the seed label and local rules.',
      'Rules on treated seed, seed saving and pesticide disposal differ by place. When in doubt, ask your extension office before you act.',
    ],
  },
];

export default function CautionsPage() {
  return (
    <div className="mx-auto max-w-3xl">
      <PageHeader
        eyebrow="Field safety"
        title="Cautions"
        description="A trial is worth nothing if someone gets hurt running it. Read this before you weigh seed, sow strips or thresh."
      />
      <nav aria-label="On this page" className="mb-8">
        <ul className="flex flex-wrap gap-2">
          {CAUTIONS.map((c) => (
            <li key={c.id}>
              <a
                href={`#${c.id}`}
                className="inline-flex min-h-9 items-center rounded-full border border-line bg-surface px-3 text-label font-medium text-accent no-underline hover:border-accent"
              >
                {c.title}
              </a>
            </li>
          ))}
        </ul>
      </nav>
      <div className="space-y-6">
        {CAUTIONS.map((c, index) => (
          <section
            key={c.id}
            id={c.id}
            aria-labelledby={`${c.id}-title`}
            className="scroll-mt-24 rounded-card border border-line border-l-4 border-l-straw-500 bg-surface p-5 shadow-card sm:p-6"
          >
            <h2 id={`${c.id}-title`} className="flex items-baseline gap-3 text-heading text-ink">
              <span className="figures text-label font-bold text-straw-700 dark:text-straw-300">
                {String(index + 1).padStart(2, '0')}
              </span>
              {c.title}
            </h2>
            <p className="mt-2 text-ink-muted">{c.lead}</p>
            <ul className="mt-4 space-y-2.5">
              {c.points.map((point, i) => (
                <li key={i} className="flex gap-3">
                  <span
                    aria-hidden="true"
                    className="mt-2.5 size-1.5 shrink-0 rounded-full bg-accent"
                  />
                  <span>{point}</span>
                </li>
              ))}
            </ul>
          </section>
        ))}
      </div>
    </div>
  );
}
