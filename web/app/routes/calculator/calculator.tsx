// `/calculator`: the public seed calculator; results update as you type.
import { PageHeader } from '../../../components/ui/page-header';
import { SeedCalculator } from '../../../features/calculator/components/seed-calculator';

export default function CalculatorPage() {
  return (
    <>
      <PageHeader
        eyebrow="Seed calculator"
        title="From one seeding rate to all the others"
        description="Enter a rate — or the stand you want — and your seed lot, in imperial or metric units. Seeds per length of row and per area, the weight per area, grams per row and strip and seeds per wheel turn follow."
      />
      <SeedCalculator />
    </>
  );
}
