import { useNavigate } from 'react-router-dom';
import type { Brief } from '../../../shared/api/briefs.js';
import { Card } from '../../components/ui/card.js';
import { QueryView } from '../../components/ui/query-view.js';
import { BriefForm } from '../../features/briefs/components/brief-form.js';
import { useMaterials } from '../../features/materials/api/get-materials.js';
import { SafetyCautions } from '../../features/materials/components/safety-cautions.js';

/** The brief form with the catalogue's materials and the safety cautions beside the choice. */
export function BriefEditorFrame({ studioId, brief }: { studioId: number; brief: Brief | null }) {
  const materials = useMaterials();
  const navigate = useNavigate();
  return (
    <Card>
      <QueryView query={materials} loadingLabel="Loading the material catalogue…" errorTitle="The material catalogue could not be loaded">
        {(list) => (
          <BriefForm
            studioId={studioId}
            brief={brief}
            materials={list}
            materialNote={<SafetyCautions compact />}
            onSaved={(saved, intent) => {
              if (!brief) navigate(intent === 'publish' ? `/briefs/${saved.id}` : `/briefs/${saved.id}/edit`, { replace: true });
            }}
          />
        )}
      </QueryView>
    </Card>
  );
}
