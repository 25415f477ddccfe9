// Wizard step 3: blocks per site and the strip itself (rows, row spacing, length, border rows),
// in the trial's unit system.
import { useFormContext, useWatch } from 'react-hook-form';
import { parseDecimal } from '../../../../shared/units/parse-decimal';
import { Alert } from '../../../components/ui/alert';
import { FormNumberField } from '../../../components/ui/form-controls';
import { wizardUnits, type WizardValues } from './wizard-values';

export function StripsStep({ locked }: { locked: boolean }) {
  const { control } = useFormContext<WizardValues>();
  const [unitSystem, crop, customBushel, blocksText] = useWatch({
    control,
    name: ['unitSystem', 'crop', 'customBushel', 'blocksPerSite'],
  });
  const units = wizardUnits({ unitSystem, crop, customBushel });
  const blocks = parseDecimal(blocksText);
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <FormNumberField
        name="blocksPerSite"
        whole
        label="Blocks per site"
        hint="Each block holds every rate once. 4 is a good start; 5–6 when small differences matter."
        required
        disabled={locked}
      />
      <FormNumberField name="rowsPerStrip" whole label="Rows per strip" required />
      <FormNumberField
        name="rowSpacing"
        label="Row spacing"
        suffix={units.rowSpacing.unit}
        required
      />
      <FormNumberField
        name="stripLength"
        label="Strip length"
        suffix={units.stripLength.unit}
        required
      />
      <FormNumberField
        name="borderRows"
        whole
        label="Border rows"
        hint="Rows on each side of a strip that are sown but not counted or harvested."
      />
      {blocks.ok && blocks.value !== null && blocks.value < 3 ? (
        <Alert tone="caution" title="Fewer than 3 blocks" className="sm:col-span-2">
          With 2 blocks a site has very few error degrees of freedom, so only large differences
          show. Use at least 3, better 4.
        </Alert>
      ) : null}
    </div>
  );
}
