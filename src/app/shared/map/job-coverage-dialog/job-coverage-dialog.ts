import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { JobCoverageMap } from '../job-coverage/job-coverage';

export interface JobCoverageDialogData {
  assignmentId: number;
  /** The job as people call it, e.g. "North Quarter seeding". */
  title: string;
}

/** A job's coverage map in a dialog, for screens that list jobs (the owner's board). Open it through MatDialog. */
@Component({
  selector: 'app-job-coverage-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [JobCoverageMap, MatButtonModule, MatDialogModule],
  template: `
    <h2 mat-dialog-title>Coverage of {{ data.title }}</h2>
    <mat-dialog-content>
      <app-job-coverage [assignmentId]="data.assignmentId" [open]="true" />
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Close</button>
    </mat-dialog-actions>
  `,
})
export class JobCoverageDialog {
  protected readonly data = inject<JobCoverageDialogData>(MAT_DIALOG_DATA);
}
