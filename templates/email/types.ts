// What every Sondage e-mail is built from: people by name, the engagement and the sample by their labels.

export interface Person {
  name: string;
}
export interface EngagementRef {
  clientName: string;
  name: string;
}
export interface SampleRef {
  name: string;
}

export interface RenderedEmail {
  subject: string;
  text: string;
  html: string;
}

/** What every sample message shares: who receives it, who acted, on which sample, where to look, and when. */
export interface SampleEventData {
  recipient: Person;
  actor: Person;
  engagement: EngagementRef;
  sample: SampleRef;
  sampleUrl: string;
  at: Date | string;
}

export const engagementLabel = (e: EngagementRef) => `${e.clientName} — ${e.name}`;
