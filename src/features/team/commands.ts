// The owner's team commands. Each answers with what changed; the list is refetched after.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LinkPurpose, NewPersonBody, PersonPatchBody, TeamMember } from '@/domain/team-schemas';
import { send } from '@/lib/commands';
import { teamKeys } from '@/queries/team';

export type TeamCommand =
  | { kind: 'add'; body: NewPersonBody }
  | { kind: 'patch'; id: number; body: PersonPatchBody }
  | { kind: 'link'; id: number; purpose: LinkPurpose }
  | { kind: 'pin'; id: number; pin: string | null };

export type TeamResult =
  | { kind: 'add'; member: TeamMember; mailed: boolean }
  | { kind: 'patch'; member: TeamMember }
  | { kind: 'link'; purpose: LinkPurpose; to: string }
  | { kind: 'pin'; id: number; cleared: boolean };

async function run(c: TeamCommand): Promise<TeamResult> {
  switch (c.kind) {
    case 'add':
      return { kind: 'add', ...(await send.addPerson(c.body)) };
    case 'patch':
      return { kind: 'patch', ...(await send.updatePerson({ id: c.id, ...c.body })) };
    case 'link':
      return { kind: 'link', ...(await send.sendLink({ id: c.id, purpose: c.purpose })) };
    case 'pin':
      await send.setPin({ id: c.id, pin: c.pin });
      return { kind: 'pin', id: c.id, cleared: c.pin === null };
  }
}

export function useTeamCommand() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: run, onSettled: () => qc.invalidateQueries({ queryKey: teamKeys.list() }) });
}
