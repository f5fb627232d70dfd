import { useState } from 'react';
import type { QueryClient } from '@tanstack/react-query';
import type { Material } from '../../../shared/api/materials.js';
import { Card, CardHeader } from '../../components/ui/card.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { QueryView } from '../../components/ui/query-view.js';
import { materialsQueryOptions, useMaterials } from '../../features/materials/api/get-materials.js';
import { MaterialForm } from '../../features/materials/components/material-form.js';
import { MaterialsTable } from '../../features/materials/components/materials-table.js';
import { SafetyCautions } from '../../features/materials/components/safety-cautions.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';

export function makeLoader(queryClient: QueryClient) {
  return async () => {
    await Promise.allSettled([queryClient.ensureQueryData(materialsQueryOptions())]);
    return null;
  };
}

export function Component() {
  useDocumentTitle('Material catalogue');
  const materials = useMaterials();
  const [editing, setEditing] = useState<Material | null>(null);

  return (
    <div className="space-y-8">
      <PageHeader
        eyebrow="Admin"
        title="Material catalogue"
        description="The sheets the maker space cuts. Briefs choose from this list; prohibited materials stay listed with their reason and cannot be chosen."
      />
      <SafetyCautions />
      <div className="space-y-8">
        <Card aria-labelledby="materials-heading">
          <CardHeader id="materials-heading" title="Materials" description="Thickness and kerf go into every audit and cut pack that uses the material." />
          <QueryView query={materials} loadingLabel="Loading the catalogue…" errorTitle="The catalogue could not be loaded">
            {(list) => (
              <MaterialsTable
                materials={list}
                onEdit={(material) => {
                  setEditing(material);
                  // The form sits below the table; bring it into view for the edit.
                  requestAnimationFrame(() => document.getElementById('material-form-heading')?.scrollIntoView({ block: 'start' }));
                }}
              />
            )}
          </QueryView>
        </Card>
        <Card aria-labelledby="material-form-heading" className="max-w-3xl">
          <CardHeader
            id="material-form-heading"
            title={editing ? `Edit ${editing.name}` : 'Add a material'}
            description={editing ? 'Changes apply to briefs that use it from their next audit.' : 'Lengths in millimetres.'}
          />
          <MaterialForm key={editing?.id ?? 'new'} material={editing} onClose={() => setEditing(null)} />
        </Card>
      </div>
    </div>
  );
}
