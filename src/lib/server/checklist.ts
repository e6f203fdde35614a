// The probe checklist of a diagnosis the visitor may view: planned from the stored readings,
// shared by the print page and the PDF so both show the same steps.
import { checklistModel, type ChecklistModel } from '$lib/diagnosis/checklist';
import { meterOf } from '$lib/diagnosis/session';
import { requireDiagnosis } from './access';
import * as diagnosisStore from './diagnoses';

export async function checklistFor(locals: App.Locals, diagnosisId: string, printedAt = new Date()): Promise<{ model: ChecklistModel; loaded: diagnosisStore.Loaded }> {
	const { diagnosis, diagram, vehicle } = await requireDiagnosis(locals, diagnosisId, 'view');
	const loaded = await diagnosisStore.load(diagnosis);
	const { result } = await diagnosisStore.planOf(loaded);
	const model = checklistModel({
		vehicle,
		diagram: { title: diagram.title },
		diagnosis: loaded.diagnosis,
		document: loaded.document,
		result,
		meter: meterOf(loaded.diagnosis.meter),
		readings: loaded.readings,
		printedAt,
		dates: locals.dates
	});
	return { model, loaded };
}
