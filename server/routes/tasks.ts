import {
  createTaskCommentSchema,
  createTaskSchema,
  taskListQuerySchema,
  taskParamsSchema,
  updateTaskSchema,
  type MemberListDTO,
  type TaskAnswerDTO,
  type TaskCommentAnswerDTO,
  type TaskPageDTO,
} from '../../shared/api/tasks';
import { currentUser } from '../auth/current-user';
import { changeTask, commentOnTask, createTask } from '../commands/tasks';
import { found } from '../errors';
import type { User } from '../models/User';
import { authorize } from '../policies';
import { presentMember, presentTask, presentTaskComment, presentTaskDetail } from '../presenters/task';
import { findClass } from '../queries/classes';
import { findTask, listActiveMembers, listTasks, taskComments, taskEvents } from '../queries/tasks';
import { defineRoutes } from './define';
import { parse } from './validate';

/** A task with its history and comments, as every task answer gives it. */
async function taskAnswer(actor: User, id: number): Promise<TaskAnswerDTO> {
  const row = found(await findTask(actor.organisationId, id), 'Task');
  return { task: presentTaskDetail(row, await taskEvents(id), await taskComments(id)) };
}

/**
 * /api/tasks: refactor tasks on class lineages. Leads create, edit and reassign; the assignee
 * engineer (or a lead) moves the status; engineers and up comment; everyone reads. No API token
 * reaches these routes: tasks are people's work, not a repository's results.
 */
export const taskRoutes = defineRoutes('/tasks', [
  {
    method: 'get',
    path: '/',
    guard: 'tasks.read',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const query = parse(taskListQuerySchema, req.query);
      const { rows, total } = await listTasks(actor.organisationId, actor.id, query);
      const answer: TaskPageDTO = { tasks: rows.map(presentTask), total, page: query.page, pageSize: query.pageSize };
      res.json(answer);
    },
  },
  {
    method: 'post',
    path: '/',
    guard: 'tasks.create',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const input = parse(createTaskSchema, req.body);
      const cloneClass = found(await findClass(actor.organisationId, input.cloneClassId), 'Clone class');
      authorize(actor, 'tasks.assign', cloneClass);
      const id = await createTask(actor, cloneClass, input);
      res.status(201).json(await taskAnswer(actor, id));
    },
  },
  {
    method: 'get',
    path: '/:id',
    guard: 'tasks.read',
    handler: async (req, res) => {
      const { id } = parse(taskParamsSchema, req.params);
      const actor = currentUser(req);
      authorize(actor, 'tasks.read', found(await findTask(actor.organisationId, id), 'Task'));
      res.json((await taskAnswer(actor, id)).task);
    },
  },
  {
    method: 'patch',
    path: '/:id',
    guard: 'tasks.work',
    handler: async (req, res) => {
      const { id } = parse(taskParamsSchema, req.params);
      const input = parse(updateTaskSchema, req.body);
      const actor = currentUser(req);
      const task = found(await findTask(actor.organisationId, id), 'Task');
      authorize(actor, 'tasks.read', task);
      await changeTask(actor, task, input);
      res.json(await taskAnswer(actor, id));
    },
  },
  {
    method: 'post',
    path: '/:id/comments',
    guard: 'tasks.comment',
    handler: async (req, res) => {
      const { id } = parse(taskParamsSchema, req.params);
      const { body } = parse(createTaskCommentSchema, req.body);
      const actor = currentUser(req);
      const task = found(await findTask(actor.organisationId, id), 'Task');
      authorize(actor, 'tasks.comment', task);
      const answer: TaskCommentAnswerDTO = { comment: presentTaskComment(await commentOnTask(actor, task, body)) };
      res.status(201).json(answer);
    },
  },
]);

/** /api/members: the organisation's active members, read-only, for a lead choosing an assignee (not user management). */
export const memberRoutes = defineRoutes('/members', [
  {
    method: 'get',
    path: '/',
    guard: 'tasks.assign',
    handler: async (req, res) => {
      const actor = currentUser(req);
      const answer: MemberListDTO = { members: (await listActiveMembers(actor.organisationId)).map(presentMember) };
      res.json(answer);
    },
  },
]);
